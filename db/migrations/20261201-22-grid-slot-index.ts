import type { Knex } from 'knex';

/**
 * The grid groups a block's observations by vine. Kept in vine order (row, position) and carrying
 * every column the grid reads, this index lets PostgreSQL stream those groups from the index alone,
 * where a scan of the table had to hash 200,000 rows. It replaces the index of 20261201-21, whose
 * date order the grid never used.
 */
export async function up(knex: Knex) {
  await knex.raw('drop index if exists observations_grid_address_idx');
  await knex.raw(`create index observations_grid_slot_idx on observations (block_id, row_number, position)
    include (organisation_id, kind, severity, status, observed_at, recorded_by, position_id) where deleted_at is null`);
}

export async function down(knex: Knex) {
  await knex.raw('drop index if exists observations_grid_slot_idx');
  await knex.raw(`create index observations_grid_address_idx on observations (block_id, observed_at)
    include (organisation_id, row_number, position, position_id, kind, severity, status, recorded_by) where deleted_at is null`);
}
