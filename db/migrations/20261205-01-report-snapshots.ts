import type { Knex } from 'knex';

/**
 * A block's season report, kept once worked out (lib/server/services/reports.ts), so the estate
 * report reads nine blocks' figures instead of working through a million records each time.
 *
 * - block_revisions: per block, a number every change to what its report reads moves on. The
 *   triggers below move it in the writing transaction, so a reader who saw revision N and then
 *   reads the data sees at least every change that N counts.
 * - report_snapshots: a report as worked out at a revision, under a key for everything else it
 *   depends on (season, inputs, settings, units, the block's own row, the code). A snapshot is
 *   used only while its block is still at that revision.
 */
const BY_BLOCK = ['observations', 'measurements', 'tasks', 'row_work', 'flags', 'vine_positions', 'block_rows'];
const BY_OTHER: [table: string, via: string][] = [
  ['blocks', 'self'],
  ['task_items', 'task'],
  ['vines', 'slot'],
];
/** The blocks a statement's rows (a transition table) belong to, as SQL. */
const VIA: Record<string, (rows: string) => string> = {
  block: (rows) => `select distinct block_id from ${rows}`,
  self: (rows) => `select id from ${rows}`,
  task: (rows) => `select distinct t.block_id from tasks t where t.id in (select task_id from ${rows})`,
  slot: (rows) => `select distinct vp.block_id from vine_positions vp where vp.id in (select position_id from ${rows})`,
};
const OPS = [
  ['inserted', 'insert', 'new table as new_rows'],
  ['updated', 'update', 'old table as old_rows new table as new_rows'],
  ['deleted', 'delete', 'old table as old_rows'],
] as const;

export async function up(knex: Knex) {
  await knex.raw(`create table block_revisions (
    block_id uuid primary key references blocks(id) on delete cascade,
    revision bigint not null
  )`);
  await knex.raw(`create table report_snapshots (
    block_id uuid not null references blocks(id) on delete cascade,
    season int not null,
    key text not null,
    revision bigint not null,
    report jsonb not null,
    made_at timestamptz not null default now(),
    primary key (block_id, season, key)
  )`);

  // Blocks deleted in the same statement (a cascade) have no row to move; the join leaves them out.
  // Rows are taken in one order everywhere, so two writers cannot deadlock here.
  await knex.raw(`create function report_revise(ids uuid[]) returns void language sql as $$
    insert into block_revisions as r (block_id, revision)
      select b.id, 1 from blocks b where b.id = any(ids) order by b.id
      on conflict (block_id) do update set revision = r.revision + 1
  $$`);

  // One function per way a row names its block: in a column, by being one, through its task or its slot.
  for (const [via, blocksOf] of Object.entries(VIA)) {
    await knex.raw(`create function report_rows_changed_${via}() returns trigger language plpgsql as $$
      begin
        if tg_op = 'INSERT' then
          perform report_revise(array(${blocksOf('new_rows')}));
        elsif tg_op = 'DELETE' then
          perform report_revise(array(${blocksOf('old_rows')}));
        else
          perform report_revise(array(${blocksOf('new_rows')} union ${blocksOf('old_rows')}));
        end if;
        return null;
      end $$`);
  }
  for (const table of BY_BLOCK) await triggers(knex, table, 'block');
  for (const [table, via] of BY_OTHER) await triggers(knex, table, via);

  // Pay rates and season start are the organisation's; names of people appear beside tasks and work.
  await knex.raw(`create function report_organisation_changed() returns trigger language plpgsql as $$
    begin
      perform report_revise(array(select id from blocks where organisation_id = new.id));
      return null;
    end $$`);
  await knex.raw(`create trigger report_organisation_changed after update on organisations
    for each row when (old is distinct from new) execute function report_organisation_changed()`);
  await knex.raw(`create function report_person_renamed() returns trigger language plpgsql as $$
    begin
      perform report_revise(array(
        select b.id from blocks b join memberships m on m.organisation_id = b.organisation_id where m.user_id = new.id));
      return null;
    end $$`);
  await knex.raw(`create trigger report_person_renamed after update of name, email on users
    for each row when (old.name is distinct from new.name or old.email is distinct from new.email)
    execute function report_person_renamed()`);

  // TRUNCATE fires none of the above: forget every snapshot with it.
  await knex.raw(`create function report_rows_truncated() returns trigger language plpgsql as $$
    begin
      truncate report_snapshots;
      return null;
    end $$`);
  for (const table of [...BY_BLOCK, ...BY_OTHER.map(([t]) => t)].filter((t) => t !== 'blocks')) {
    await knex.raw(`create trigger report_${table}_truncated after truncate on ${table} for each statement execute function report_rows_truncated()`);
  }
}

async function triggers(knex: Knex, table: string, via: string) {
  for (const [name, op, referencing] of OPS) {
    await knex.raw(`create trigger report_${table}_${name} after ${op} on ${table}
      referencing ${referencing} for each statement execute function report_rows_changed_${via}()`);
  }
}

export async function down(knex: Knex) {
  for (const table of [...BY_BLOCK, ...BY_OTHER.map(([t]) => t)]) {
    for (const [name] of OPS) await knex.raw(`drop trigger if exists report_${table}_${name} on ${table}`);
    await knex.raw(`drop trigger if exists report_${table}_truncated on ${table}`);
  }
  await knex.raw('drop trigger if exists report_organisation_changed on organisations');
  await knex.raw('drop trigger if exists report_person_renamed on users');
  for (const via of Object.keys(VIA)) await knex.raw(`drop function if exists report_rows_changed_${via}()`);
  for (const fn of ['report_organisation_changed()', 'report_person_renamed()', 'report_rows_truncated()', 'report_revise(uuid[])']) {
    await knex.raw(`drop function if exists ${fn}`);
  }
  await knex.raw('drop table if exists report_snapshots');
  await knex.raw('drop table if exists block_revisions');
}
