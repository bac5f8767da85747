import type { Knex } from 'knex';

/**
 * The observation export reads a season page by page in (observed_at, id) order. With these
 * indexes each page starts where the last one ended and stops after its rows; without them every
 * page scanned and sorted the rest of the season, so a large export slowed down page after page.
 */
export async function up(knex: Knex) {
  await knex.raw(`create index observations_export_block_idx on observations (block_id, observed_at, id) where deleted_at is null`);
  await knex.raw(`create index observations_export_org_idx on observations (organisation_id, observed_at, id) where deleted_at is null`);
}

export async function down(knex: Knex) {
  await knex.raw('drop index if exists observations_export_org_idx');
  await knex.raw('drop index if exists observations_export_block_idx');
}
