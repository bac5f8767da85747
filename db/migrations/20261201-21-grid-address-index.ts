import type { Knex } from 'knex';

/**
 * The grid reads each vine's address (row and position) straight from its observations, so the
 * block's index carries them too; it replaces the one from 20261201-20.
 */
export async function up(knex: Knex) {
  await knex.raw('drop index if exists observations_grid_idx');
  await knex.raw(`create index observations_grid_address_idx on observations (block_id, observed_at)
    include (organisation_id, row_number, position, position_id, kind, severity, status, recorded_by) where deleted_at is null`);
}

export async function down(knex: Knex) {
  await knex.raw('drop index if exists observations_grid_address_idx');
  await knex.raw(`create index observations_grid_idx on observations (block_id, observed_at)
    include (organisation_id, position_id, kind, severity, status, recorded_by) where deleted_at is null`);
}
