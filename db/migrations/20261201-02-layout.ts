import type { Knex } from 'knex';

/**
 * Blocks, their rows and planting slots. A slot (vine_positions) is numbered from an agreed row
 * end and never renumbered; the plants that stood in it over the years are rows of `vines`.
 */
export async function up(knex: Knex) {
  await knex.schema.createTable('blocks', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.text('name').notNullable();
    t.text('variety').notNullable();
    t.text('clone');
    t.text('rootstock');
    t.integer('planting_year');
    t.text('training_system').notNullable().defaultTo('cane');
    t.decimal('row_spacing_m', 6, 3).notNullable();
    t.decimal('vine_spacing_m', 6, 3).notNullable();
    t.integer('row_count').notNullable();
    t.integer('vines_per_row').notNullable();
    t.integer('vines_per_panel');
    t.integer('first_row').notNullable().defaultTo(1);
    // Which way row numbers run on the grid, and where vine 1 of each row stands.
    t.text('row_order').notNullable().defaultTo('ascending');
    t.text('position_origin');
    t.integer('row_bearing_deg');
    t.text('notes');
    t.timestamp('archived_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['organisation_id']);
  });
  await knex.raw(`alter table blocks add constraint blocks_training_system_check check (training_system in ('cane', 'spur', 'other'))`);
  await knex.raw(`alter table blocks add constraint blocks_row_order_check check (row_order in ('ascending', 'descending'))`);
  await knex.raw(`alter table blocks add constraint blocks_sizes_check check (
    row_spacing_m > 0 and vine_spacing_m > 0 and row_count > 0 and vines_per_row > 0
    and (vines_per_panel is null or vines_per_panel > 0))`);
  await knex.raw(`create unique index blocks_name_unique on blocks (organisation_id, lower(name)) where archived_at is null`);

  await knex.schema.createTable('block_rows', (t) => {
    t.uuid('block_id').notNullable().references('blocks.id').onDelete('CASCADE');
    t.integer('row_number').notNullable();
    t.integer('vine_count').notNullable();
    t.primary(['block_id', 'row_number']);
  });
  await knex.raw(`alter table block_rows add constraint block_rows_vine_count_check check (vine_count > 0)`);

  await knex.schema.createTable('vine_positions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('block_id').notNullable().references('blocks.id').onDelete('CASCADE');
    t.integer('row_number').notNullable();
    t.integer('position').notNullable();
    t.text('status').notNullable().defaultTo('planted');
    t.integer('replant_year');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['block_id', 'row_number', 'position']);
    t.foreign(['block_id', 'row_number']).references(['block_id', 'row_number']).inTable('block_rows').onDelete('CASCADE');
  });
  await knex.raw(`alter table vine_positions add constraint vine_positions_status_check
    check (status in ('planted', 'missing', 'dead', 'replant'))`);

  await knex.schema.createTable('vines', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('position_id').notNullable().references('vine_positions.id').onDelete('CASCADE');
    t.integer('planting_year');
    t.text('clone');
    t.text('rootstock');
    t.integer('removed_year');
    t.text('removal_reason');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['position_id']);
  });
}

export async function down(knex: Knex) {
  for (const table of ['vines', 'vine_positions', 'block_rows', 'blocks']) await knex.schema.dropTableIfExists(table);
}
