import type { Knex } from 'knex';

/**
 * The grid's standing summary, kept by PostgreSQL itself so that no write path can forget it.
 *
 * Reading every observation of a large block on each grid request costs about 150 ms at 200,000
 * observations; the morning view (open findings, any kind) needs only one small row per vine:
 *
 * - grid_vines: per planting slot, the worst severity per kind among open and among closed
 *   findings, packed three bits per kind (0 = none, 1–4 = severity 0–3; kind i at bits 3i…3i+2,
 *   in the order of grid_kind_index), and how many live records the slot has;
 * - grid_counts: live observations counted per block, UTC day, kind, severity, status and person,
 *   so that the summary's counts answer date and person filters without reading observations.
 *
 * Statement-level triggers on observations keep both, safe with several writers at once. Counts
 * change by deltas and new findings merge into a vine's levels by taking the worse per kind: an
 * upsert applies either to the row as last committed, under its lock, so concurrent inserts add up.
 * Closing, editing or deleting findings recomputes the vines concerned from their observations
 * after locking their summary rows: under READ COMMITTED the recomputation then sees every writer
 * that committed before it, and writers after it wait for it.
 */
const KINDS = [
  'cane-diameter',
  'shade-cane',
  'weak-budbreak',
  'trunk-injury',
  'cane-injury',
  'missing-vine',
  'bud-injury',
  'pruning-record',
  'pruning-check',
  'note',
];

export async function up(knex: Knex) {
  await knex.raw(`create function grid_kind_index(kind text) returns int language plpgsql immutable parallel safe as $$
    declare i int := array_position(array[${KINDS.map((k) => `'${k}'`).join(', ')}]::text[], kind);
    begin
      if i is null then
        raise exception 'grid_kind_index does not know the observation kind %; add it in a migration', kind;
      end if;
      return i - 1;
    end $$`);

  // The worst level and the kinds at "watch" or worse (bit i + 1 for kind i, as lib/grid/cells.ts
  // reads them) are kept beside the packed levels, worked out once per write instead of per read;
  // written for 21 kinds, all that fit in the packed levels, so a new kind needs no change here.
  const fields = (column: string) => Array.from({ length: 21 }, (_, i) => `((${column} >> ${3 * i}) & 7)`);
  const worst = (column: string) => `greatest(${fields(column).join(', ')})::smallint`;
  const kinds = (column: string) =>
    `(${fields(column)
      .map((f, i) => `case when ${f} >= 2 then ${2 ** (i + 1)} else 0 end`)
      .join(' + ')})::int`;
  await knex.raw(`create table grid_vines (
    position_id uuid primary key references vine_positions (id) on delete cascade,
    organisation_id uuid not null references organisations (id) on delete cascade,
    block_id uuid not null references blocks (id) on delete cascade,
    open_levels bigint not null,
    closed_levels bigint not null,
    records int not null,
    open_worst smallint generated always as (${worst('open_levels')}) stored,
    closed_worst smallint generated always as (${worst('closed_levels')}) stored,
    open_kinds int generated always as (${kinds('open_levels')}) stored,
    closed_kinds int generated always as (${kinds('closed_levels')}) stored
  )`);
  await knex.raw(`create index grid_vines_block_idx on grid_vines (block_id)
    include (position_id, organisation_id, open_levels, closed_levels, records, open_worst, closed_worst, open_kinds, closed_kinds)`);

  await knex.raw(`create table grid_counts (
    block_id uuid not null references blocks (id) on delete cascade,
    organisation_id uuid not null references organisations (id) on delete cascade,
    day date not null,
    kind text not null,
    severity smallint not null,
    status text not null,
    recorded_by uuid,
    n int not null,
    constraint grid_counts_key unique nulls not distinct (block_id, day, kind, severity, status, recorded_by)
  )`);

  await knex.raw(`create function grid_merge_levels(a bigint, b bigint) returns bigint language sql immutable parallel safe
    return (select coalesce(sum(greatest((a >> (3 * i)) & 7, (b >> (3 * i)) & 7) << (3 * i)), 0)::bigint from generate_series(0, 20) i)`);

  await knex.raw(`create function grid_refresh_vines(positions uuid[]) returns void language plpgsql as $$
    begin
      -- Every vine concerned gets a row to lock (waiting for a writer that is inserting it), then
      -- the rows are locked in one order everywhere, so two writers cannot deadlock here.
      insert into grid_vines (position_id, organisation_id, block_id, open_levels, closed_levels, records)
        select vp.id, b.organisation_id, b.id, 0, 0, 0 from vine_positions vp join blocks b on b.id = vp.block_id
        where vp.id = any(positions) order by vp.id
        on conflict (position_id) do nothing;
      perform 1 from grid_vines where position_id = any(positions) order by position_id for update;
      insert into grid_vines as g (position_id, organisation_id, block_id, open_levels, closed_levels, records)
        select position_id, organisation_id, block_id,
          bit_or(coalesce(open_level, 0)::bigint << (3 * k)), bit_or(coalesce(closed_level, 0)::bigint << (3 * k)), sum(n)::int
        from (
          select position_id, organisation_id, block_id, grid_kind_index(kind) as k,
            max(severity) filter (where status = 'open') + 1 as open_level,
            max(severity) filter (where status = 'closed') + 1 as closed_level,
            count(*) as n
          from observations where position_id = any(positions) and deleted_at is null
          group by position_id, organisation_id, block_id, kind
        ) per_kind
        group by position_id, organisation_id, block_id
        on conflict (position_id) do update
          set open_levels = excluded.open_levels, closed_levels = excluded.closed_levels, records = excluded.records;
      delete from grid_vines g where g.position_id = any(positions)
        and not exists (select 1 from observations o where o.position_id = g.position_id and o.deleted_at is null);
    end $$`);

  await knex.raw(`create type grid_change as (
    position_id uuid, organisation_id uuid, block_id uuid, observed_at timestamptz, kind text, severity smallint,
    status text, recorded_by uuid, d int
  )`);

  // Only the columns the grid reads matter: an edited note or measurement changes nothing here.
  await knex.raw(`create function grid_observations_changed() returns trigger language plpgsql as $$
    declare changes grid_change[];
    begin
      if tg_op = 'INSERT' then
        changes := array(select row(position_id, organisation_id, block_id, observed_at, kind, severity, status, recorded_by, 1)::grid_change
          from new_rows where deleted_at is null);
      elsif tg_op = 'DELETE' then
        changes := array(select row(position_id, organisation_id, block_id, observed_at, kind, severity, status, recorded_by, -1)::grid_change
          from old_rows where deleted_at is null);
      else
        changes := array(
          select row(o.position_id, o.organisation_id, o.block_id, o.observed_at, o.kind, o.severity, o.status, o.recorded_by, -1)::grid_change
            from old_rows o join new_rows n using (id)
            where o.deleted_at is null and (o.position_id, o.block_id, o.observed_at, o.kind, o.severity, o.status, o.recorded_by, n.deleted_at is null)
              is distinct from (n.position_id, n.block_id, n.observed_at, n.kind, n.severity, n.status, n.recorded_by, true)
          union all
          select row(n.position_id, n.organisation_id, n.block_id, n.observed_at, n.kind, n.severity, n.status, n.recorded_by, 1)::grid_change
            from old_rows o join new_rows n using (id)
            where n.deleted_at is null and (o.position_id, o.block_id, o.observed_at, o.kind, o.severity, o.status, o.recorded_by, o.deleted_at is null)
              is distinct from (n.position_id, n.block_id, n.observed_at, n.kind, n.severity, n.status, n.recorded_by, true));
      end if;
      if cardinality(changes) = 0 then
        return null;
      end if;

      insert into grid_counts as c (block_id, organisation_id, day, kind, severity, status, recorded_by, n)
        select block_id, organisation_id, (observed_at at time zone 'UTC')::date as day, kind, severity, status, recorded_by, sum(d)::int
        from unnest(changes)
        group by block_id, organisation_id, day, kind, severity, status, recorded_by
        having sum(d) <> 0
        order by block_id, day, kind, severity, status, recorded_by
        on conflict on constraint grid_counts_key do update set n = c.n + excluded.n;

      if tg_op = 'INSERT' then
        insert into grid_vines as g (position_id, organisation_id, block_id, open_levels, closed_levels, records)
          select position_id, organisation_id, block_id,
            bit_or(coalesce(open_level, 0)::bigint << (3 * k)), bit_or(coalesce(closed_level, 0)::bigint << (3 * k)), sum(n)::int
          from (
            select position_id, organisation_id, block_id, grid_kind_index(kind) as k,
              max(severity) filter (where status = 'open') + 1 as open_level,
              max(severity) filter (where status = 'closed') + 1 as closed_level,
              count(*) as n
            from unnest(changes)
            group by position_id, organisation_id, block_id, kind
          ) per_kind
          group by position_id, organisation_id, block_id
          order by position_id
          on conflict (position_id) do update
            set open_levels = grid_merge_levels(g.open_levels, excluded.open_levels),
              closed_levels = grid_merge_levels(g.closed_levels, excluded.closed_levels),
              records = g.records + excluded.records;
      else
        perform grid_refresh_vines(array(select distinct position_id from unnest(changes)));
      end if;
      return null;
    end $$`);

  await knex.raw(`create trigger grid_observations_inserted after insert on observations
    referencing new table as new_rows for each statement execute function grid_observations_changed()`);
  await knex.raw(`create trigger grid_observations_updated after update on observations
    referencing old table as old_rows new table as new_rows for each statement execute function grid_observations_changed()`);
  await knex.raw(`create trigger grid_observations_deleted after delete on observations
    referencing old table as old_rows for each statement execute function grid_observations_changed()`);

  // What the field has recorded so far.
  await knex.raw(`insert into grid_counts (block_id, organisation_id, day, kind, severity, status, recorded_by, n)
    select block_id, organisation_id, (observed_at at time zone 'UTC')::date, kind, severity, status, recorded_by, count(*)
    from observations where deleted_at is null
    group by block_id, organisation_id, (observed_at at time zone 'UTC')::date, kind, severity, status, recorded_by`);
  await knex.raw(`select grid_refresh_vines(array_agg(distinct position_id)) from observations where deleted_at is null having count(*) > 0`);
}

export async function down(knex: Knex) {
  for (const t of ['inserted', 'updated', 'deleted']) await knex.raw(`drop trigger if exists grid_observations_${t} on observations`);
  await knex.raw('drop function if exists grid_observations_changed()');
  await knex.raw('drop function if exists grid_refresh_vines(uuid[])');
  await knex.raw('drop function if exists grid_merge_levels(bigint, bigint)');
  await knex.raw('drop type if exists grid_change');
  await knex.raw('drop table if exists grid_counts');
  await knex.raw('drop table if exists grid_vines');
  await knex.raw('drop function if exists grid_kind_index(text)');
}
