import type { Knex } from 'knex';

const BEFORE = `'cane-diameter', 'shade-cane', 'weak-budbreak', 'trunk-injury', 'cane-injury', 'missing-vine',
     'bud-injury', 'pruning-record', 'note'`;

/**
 * A pruning check: a crew lead's audit of what a pruner left on a vine, recorded in the field like
 * any observation. The pruner checked is kept in the data; an index serves the per-pruner report.
 */
export async function up(knex: Knex) {
  await knex.raw('alter table observations drop constraint observations_kind_check');
  await knex.raw(`alter table observations add constraint observations_kind_check check (kind in (${BEFORE}, 'pruning-check'))`);
  await knex.raw(`create index observations_pruning_check_idx on observations (organisation_id, block_id, observed_at)
    where kind = 'pruning-check' and deleted_at is null`);
}

/** Going back removes the checks themselves: the old constraint cannot hold them. */
export async function down(knex: Knex) {
  await knex.raw('drop index if exists observations_pruning_check_idx');
  await knex('observations').where({ kind: 'pruning-check' }).delete();
  await knex.raw('alter table observations drop constraint observations_kind_check');
  await knex.raw(`alter table observations add constraint observations_kind_check check (kind in (${BEFORE}))`);
}
