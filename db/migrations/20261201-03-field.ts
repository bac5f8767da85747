import type { Knex } from 'knex';

/**
 * What the field app records. Ids are made on the device (UUID v4) and the primary key makes
 * every record once-only; payload_sha256 tells a retry (same payload) from a conflict.
 */
export async function up(knex: Knex) {
  await knex.schema.createTable('observations', (t) => {
    t.uuid('id').primary();
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('block_id').notNullable().references('blocks.id').onDelete('CASCADE');
    t.uuid('position_id').notNullable().references('vine_positions.id').onDelete('CASCADE');
    t.integer('row_number').notNullable();
    t.integer('position').notNullable();
    t.text('kind').notNullable();
    t.jsonb('data').notNullable().defaultTo('{}');
    t.text('note').notNullable().defaultTo('');
    t.timestamp('observed_at', { useTz: true }).notNullable();
    t.uuid('recorded_by').references('users.id').onDelete('SET NULL');
    t.smallint('severity').notNullable().defaultTo(0);
    t.text('status').notNullable().defaultTo('open');
    t.timestamp('closed_at', { useTz: true });
    t.text('payload_sha256').notNullable();
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('deleted_at', { useTz: true });
    t.index(['block_id', 'row_number', 'position']);
    t.index(['organisation_id', 'observed_at']);
    t.index(['block_id', 'kind', 'observed_at']);
  });
  await knex.raw(`alter table observations add constraint observations_kind_check check (kind in
    ('cane-diameter', 'shade-cane', 'weak-budbreak', 'trunk-injury', 'cane-injury', 'missing-vine',
     'bud-injury', 'pruning-record', 'note'))`);
  await knex.raw(`alter table observations add constraint observations_severity_check check (severity between 0 and 3)`);
  await knex.raw(`alter table observations add constraint observations_status_check check (status in ('open', 'closed'))`);

  await knex.schema.createTable('photos', (t) => {
    t.uuid('id').primary();
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('observation_id').notNullable().references('observations.id').onDelete('CASCADE');
    t.uuid('uploaded_by').references('users.id').onDelete('SET NULL');
    // pending: presigned, bytes not yet checked; stored: verified and thumbnailed.
    t.text('status').notNullable().defaultTo('pending');
    t.text('object_key').notNullable();
    t.text('thumb_key');
    t.text('content_type');
    t.bigInteger('bytes');
    t.integer('width');
    t.integer('height');
    t.text('sha256');
    t.timestamp('taken_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('stored_at', { useTz: true });
    t.index(['observation_id']);
    t.index(['organisation_id', 'status', 'created_at']);
  });
  await knex.raw(`alter table photos add constraint photos_status_check check (status in ('pending', 'stored'))`);

  await knex.schema.createTable('sprays', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('block_id').notNullable().references('blocks.id').onDelete('CASCADE');
    t.text('product').notNullable();
    t.timestamp('applied_at', { useTz: true }).notNullable();
    t.decimal('rei_hours', 7, 2).notNullable();
    t.text('notes');
    t.uuid('recorded_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['block_id', 'applied_at']);
  });
  await knex.raw(`alter table sprays add constraint sprays_rei_check check (rei_hours >= 0)`);

  await knex.schema.createTable('sampling_plans', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('block_id').notNullable().references('blocks.id').onDelete('CASCADE');
    t.text('name').notNullable();
    t.integer('seed').notNullable();
    t.jsonb('options').notNullable();
    // The addresses in walking order, fixed when the plan is made so that every scout walks the same list.
    t.jsonb('addresses').notNullable();
    t.uuid('created_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['block_id']);
  });
}

export async function down(knex: Knex) {
  for (const table of ['sampling_plans', 'sprays', 'photos', 'observations']) await knex.schema.dropTableIfExists(table);
}
