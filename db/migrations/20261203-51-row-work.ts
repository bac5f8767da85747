import type { Knex } from 'knex';

/**
 * Row work: what a crew did to a row (or a run of it) in one pass of the season's work, recorded
 * on the phone. Ids come from the device and payload_sha256 tells a retry from a conflict, as for
 * observations. A run with no positions covers the whole row; positions are the row's slots.
 * The organisation's pay basis prices it: an hourly rate, or a piece rate per vine.
 */
export async function up(knex: Knex) {
  await knex.schema.createTable('row_work', (t) => {
    t.uuid('id').primary();
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('block_id').notNullable().references('blocks.id').onDelete('CASCADE');
    t.integer('row_number').notNullable();
    t.text('pass').notNullable();
    t.integer('from_position');
    t.integer('to_position');
    t.integer('crew_size').notNullable();
    t.specificType('person_hours', 'numeric').notNullable();
    t.timestamp('started_at', { useTz: true });
    t.timestamp('finished_at', { useTz: true }).notNullable();
    t.text('note').notNullable().defaultTo('');
    t.uuid('recorded_by').references('users.id').onDelete('SET NULL');
    t.text('payload_sha256').notNullable();
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(['block_id', 'row_number']).references(['block_id', 'row_number']).inTable('block_rows').onDelete('CASCADE');
    t.index(['block_id', 'finished_at']);
    t.index(['organisation_id', 'finished_at']);
  });
  await knex.raw(`alter table row_work add constraint row_work_pass_check
    check (pass in ('pruning', 'brush-removal', 'tying', 'pre-pruning', 'shoot-thinning'))`);
  await knex.raw(`alter table row_work add constraint row_work_sizes_check check (
    crew_size > 0 and person_hours > 0
    and (from_position is null or from_position >= 1)
    and (to_position is null or to_position >= coalesce(from_position, 1))
    and (started_at is null or started_at <= finished_at))`);

  // Progress counts standing vines as slots less the gaps (missing, dead): the gaps are few, so
  // this index lets a row's count skip its planted slots.
  await knex.raw(`create index vine_positions_gaps_index on vine_positions (block_id, row_number, position) where status in ('missing', 'dead')`);

  await knex.raw(`alter table organisations
    add column pay_basis text not null default 'hourly' constraint organisations_pay_basis_check check (pay_basis in ('hourly', 'piece-rate')),
    add column hourly_rate numeric constraint organisations_hourly_rate_check check (hourly_rate >= 0),
    add column piece_rate_per_vine numeric constraint organisations_piece_rate_check check (piece_rate_per_vine >= 0)`);
}

export async function down(knex: Knex) {
  await knex.raw('alter table organisations drop column pay_basis, drop column hourly_rate, drop column piece_rate_per_vine');
  await knex.raw('drop index vine_positions_gaps_index');
  await knex.schema.dropTableIfExists('row_work');
}
