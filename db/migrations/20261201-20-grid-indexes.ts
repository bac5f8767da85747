import type { Knex } from 'knex';

/**
 * Indexes for the row grid and the photo log. The grid reads every live observation of one block
 * (up to a season's hundreds of thousands); carrying the filtered and aggregated columns in the index
 * lets PostgreSQL answer from the index alone. The photo log pages newest first by the time a photo
 * was taken, upload time when the camera gave none.
 */
export async function up(knex: Knex) {
  await knex.raw(`create index observations_grid_idx on observations (block_id, observed_at)
    include (organisation_id, position_id, kind, severity, status, recorded_by) where deleted_at is null`);
  await knex.raw(`create index photos_log_idx on photos (organisation_id, (coalesce(taken_at, created_at)) desc, id desc)
    where status = 'stored'`);
}

export async function down(knex: Knex) {
  await knex.raw('drop index if exists photos_log_idx');
  await knex.raw('drop index if exists observations_grid_idx');
}
