import type { Knex } from 'knex';

/**
 * The month an organisation's season starts in. January keeps seasons as calendar years; an
 * estate in the southern hemisphere, pruning in July and picking in March, starts them in July or
 * so, and names each season by the year it ends in (its harvest's year).
 */
export async function up(knex: Knex) {
  await knex.raw(`alter table organisations add column season_start_month smallint not null default 1
    constraint organisations_season_start_month_check check (season_start_month between 1 and 12)`);
}

export async function down(knex: Knex) {
  await knex.raw('alter table organisations drop column season_start_month');
}
