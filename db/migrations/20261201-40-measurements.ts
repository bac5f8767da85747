import type { Knex } from 'knex';

/**
 * Weights taken by hand for the season reports: the crop picked at harvest and the one-year wood cut
 * off at winter pruning, for one vine or for a row sample of several vines weighed together (then
 * `position` is null and `vines` says how many). The season is the calendar year of `measured_on`,
 * as for observations. A per-vine weight stays on its slot; the address is kept beside the slot id
 * so reports can pair weights by row without joining every slot.
 */
export async function up(knex: Knex) {
  await knex.schema.createTable('measurements', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('block_id').notNullable().references('blocks.id').onDelete('CASCADE');
    t.text('kind').notNullable();
    t.integer('row_number').notNullable();
    t.integer('position');
    t.uuid('position_id').references('vine_positions.id').onDelete('CASCADE');
    t.integer('vines').notNullable().defaultTo(1);
    t.decimal('weight_kg', 10, 3).notNullable();
    t.integer('clusters');
    t.date('measured_on').notNullable();
    t.text('note').notNullable().defaultTo('');
    t.uuid('recorded_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['organisation_id', 'block_id', 'measured_on']);
  });
  await knex.raw(`alter table measurements add constraint measurements_kind_check check (kind in ('yield', 'pruning-weight'))`);
  await knex.raw(`alter table measurements add constraint measurements_values_check check (
    weight_kg >= 0 and vines >= 1 and (clusters is null or clusters >= 0) and row_number >= 0)`);
  // A vine's weight names its slot; a row sample names none and may cover several vines.
  await knex.raw(`alter table measurements add constraint measurements_scope_check check (
    (position is null and position_id is null) or (position is not null and position_id is not null and vines = 1))`);
}

export async function down(knex: Knex) {
  await knex.schema.dropTableIfExists('measurements');
}
