import type { Knex } from 'knex';

/** Emptying observations with TRUNCATE fires no row or statement trigger of the grid's: empty its summary with it. */
export async function up(knex: Knex) {
  await knex.raw(`create function grid_observations_truncated() returns trigger language plpgsql as $$
    begin
      truncate grid_vines, grid_counts;
      return null;
    end $$`);
  await knex.raw(`create trigger grid_observations_truncated after truncate on observations
    for each statement execute function grid_observations_truncated()`);
}

export async function down(knex: Knex) {
  await knex.raw('drop trigger if exists grid_observations_truncated on observations');
  await knex.raw('drop function if exists grid_observations_truncated()');
}
