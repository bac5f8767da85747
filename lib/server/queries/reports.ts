import 'server-only';
import type {
  KindRowCount,
  MeasuredObservation,
  MeasurementRow,
  PersistedVine,
  RecordedPruningWeight,
  ReplantSlot,
  ScoutedRow,
  SlotCounts,
  TaskRow,
} from '@/lib/reports/block-report';
import type { ExportRow } from '@/lib/reports/csv';
import { seasonBounds, seasonShiftMonths, type SeasonBounds } from '@/lib/reports/season';
import type { Db } from '@/lib/server/db';

/** Kinds whose data the report reads record by record; the rest are counted in SQL. */
export const MEASURED_KINDS = ['weak-budbreak', 'cane-diameter', 'shade-cane', 'pruning-record', 'pruning-check', 'bud-injury'] as const;

/** The season (lib/reports/season.ts) of a UTC date and time or a date, in SQL: the year of it moved on by the shift. */
const seasonOfSql = (utc: string, startMonth: number) => `extract(year from ${utc} + interval '1 month' * ${seasonShiftMonths(startMonth)})::int`;

/**
 * Seasons with live observations or weights, newest first. The observation seasons are found by
 * skipping from one season's first record to the next, so a million records cost a handful of
 * index probes, not a scan.
 */
export async function listSeasons(db: Db, organisationId: string, blockId: string | undefined, startMonth: number): Promise<number[]> {
  const scope = blockId ? 'o.organisation_id = ? and o.block_id = ?' : 'o.organisation_id = ?';
  const args = blockId ? [organisationId, blockId] : [organisationId];
  const firstSeason = seasonOfSql(`min(o.observed_at) at time zone 'UTC'`, startMonth);
  // Season N + 1 starts in the start month of year N, or of N + 1 for calendar-year seasons.
  const nextStart = `make_timestamptz(years.year + ${startMonth === 1 ? 1 : 0}, ${startMonth}, 1, 0, 0, 0, 'UTC')`;
  const { rows } = await db.raw<{ rows: { year: number }[] }>(
    `with recursive years(year) as (
       select (select ${firstSeason} from observations o where ${scope} and o.deleted_at is null)
       union all
       select (select ${firstSeason} from observations o where ${scope} and o.deleted_at is null and o.observed_at >= ${nextStart})
         from years where years.year is not null
     )
     select year from years where year is not null
     union
     select distinct ${seasonOfSql('m.measured_on', startMonth)} from measurements m where m.organisation_id = ?${blockId ? ' and m.block_id = ?' : ''}
     order by year desc`,
    [...args, ...args, ...args],
  );
  return rows.map((r) => r.year);
}

export async function countSlots(db: Db, blockId: string, bearingFromYear: number): Promise<SlotCounts> {
  const { rows } = await db.raw<{ rows: SlotCounts[] }>(
    `select count(*) filter (where status = 'planted')::int as planted,
            count(*) filter (where status = 'replant')::int as replant,
            count(*) filter (where status = 'missing')::int as missing,
            count(*) filter (where status = 'dead')::int as dead,
            count(*) filter (where status = 'replant' and replant_year is not null and replant_year <= ?)::int as "bearingReplants"
       from vine_positions where block_id = ?`,
    [bearingFromYear, blockId],
  );
  return rows[0]!;
}

const live = 'o.organisation_id = ? and o.block_id = ? and o.deleted_at is null and o.observed_at >= ? and o.observed_at < ?';
const liveArgs = (organisationId: string, blockId: string, period: SeasonBounds) => [organisationId, blockId, period.from, period.to];

/**
 * Per row and kind: vines with a record, vines whose worst record is "watch" or worse, and records;
 * per row: vines scouted (any record but a missing-vine one) and slots. One pass over the season.
 */
export async function countByRowAndKind(db: Db, organisationId: string, blockId: string, period: SeasonBounds) {
  const { rows } = await db.raw<{ rows: { kinds: KindRowCount[]; scouted: ScoutedRow[]; observations: number }[] }>(
    `with per_vine as materialized (
       select o.row_number, o.position, o.kind, max(o.severity) as worst, count(*)::int as n
         from observations o where ${live}
        group by o.row_number, o.position, o.kind
     )
     select
       (select coalesce(json_agg(json_build_object('row', row_number, 'kind', kind, 'recorded', recorded, 'affected', affected, 'observations', observations)), '[]')
          from (select row_number, kind, count(*)::int as recorded, count(*) filter (where worst >= 1)::int as affected, sum(n)::int as observations
                  from per_vine group by row_number, kind) k) as kinds,
       (select coalesce(json_agg(json_build_object('row', r.row_number, 'vines', coalesce(s.vines, 0), 'slots', r.vine_count) order by r.row_number), '[]')
          from block_rows r
          left join (select row_number, count(distinct position)::int as vines from per_vine where kind <> 'missing-vine' group by row_number) s
            on s.row_number = r.row_number
         where r.block_id = ?) as scouted,
       (select coalesce(sum(n), 0)::int from per_vine) as observations`,
    [...liveArgs(organisationId, blockId, period), blockId],
  );
  return rows[0]!;
}

export async function listMeasuredObservations(db: Db, organisationId: string, blockId: string, period: SeasonBounds): Promise<MeasuredObservation[]> {
  const { rows } = await db.raw<{ rows: (Omit<MeasuredObservation, 'observedAt'> & { observedAt: Date })[] }>(
    `select o.row_number as row, o.position, o.kind, o.data, o.observed_at as "observedAt"
       from observations o where ${live} and o.kind = any(?::text[])
      order by o.observed_at, o.id`,
    [...liveArgs(organisationId, blockId, period), [...MEASURED_KINDS]],
  );
  return rows.map((r) => ({ ...r, observedAt: r.observedAt.toISOString() }));
}

/** Weights of the seasons from `first` to `last`, both included. */
export async function listMeasurementRows(
  db: Db,
  organisationId: string,
  blockId: string,
  first: number,
  last: number,
  startMonth: number,
): Promise<MeasurementRow[]> {
  const { rows } = await db.raw<{ rows: (Omit<MeasurementRow, 'weightKg'> & { weightKg: string })[] }>(
    `select kind, ${seasonOfSql('measured_on', startMonth)} as season, row_number as row, position, vines, weight_kg as "weightKg", clusters
       from measurements
      where organisation_id = ? and block_id = ? and measured_on >= ?::date and measured_on < ?::date
      order by measured_on, id`,
    [organisationId, blockId, seasonBounds(first, startMonth).from.slice(0, 10), seasonBounds(last, startMonth).to.slice(0, 10)],
  );
  return rows.map((r) => ({ ...r, weightKg: Number(r.weightKg) }));
}

/** Pruning weights carried by pruning records of the seasons from `first` to `last`: each vine's latest. */
export async function listRecordedPruningWeights(
  db: Db,
  organisationId: string,
  blockId: string,
  first: number,
  last: number,
  startMonth: number,
): Promise<RecordedPruningWeight[]> {
  const { rows } = await db.raw<{ rows: RecordedPruningWeight[] }>(
    `select distinct on (season, o.row_number, o.position)
            ${seasonOfSql(`o.observed_at at time zone 'UTC'`, startMonth)} as season, o.row_number as row, o.position,
            (o.data->>'pruningWeightKg')::float8 as "weightKg"
       from observations o
      where o.organisation_id = ? and o.block_id = ? and o.deleted_at is null and o.kind = 'pruning-record'
        and o.observed_at >= ? and o.observed_at < ? and jsonb_typeof(o.data->'pruningWeightKg') = 'number'
      order by season, o.row_number, o.position, o.observed_at desc`,
    [organisationId, blockId, seasonBounds(first, startMonth).from, seasonBounds(last, startMonth).to],
  );
  return rows;
}

// Other engineers' tables may not exist on an older database; once seen, a table stays.
const seenTables = new Set<string>();

export async function tableExists(db: Db, table: string): Promise<boolean> {
  if (seenTables.has(table)) return true;
  const { rows } = await db.raw<{ rows: { exists: boolean }[] }>(
    `select exists (select 1 from information_schema.tables where table_schema = current_schema() and table_name = ?) as exists`,
    [table],
  );
  if (rows[0]!.exists) seenTables.add(table);
  return rows[0]!.exists;
}

/**
 * Slots that need a new vine: marked missing or dead, recorded missing or dead this season and not
 * closed, or under an open 'replant' flag (when flags exist). Each with the clone and rootstock of
 * the vine last planted there.
 */
export async function listReplantSlots(db: Db, organisationId: string, blockId: string, period: SeasonBounds): Promise<ReplantSlot[]> {
  const withFlags = await tableExists(db, 'flags');
  const flagged = withFlags
    ? `union all
       select vp.id, 'flagged' from flags f
         join vine_positions vp on vp.block_id = f.block_id and vp.row_number = f.row_number and vp.position between f.position and f.to_position
        where f.organisation_id = ? and f.block_id = ? and f.status = 'open' and f.reason = 'replant'`
    : '';
  const { rows } = await db.raw<{ rows: ReplantSlot[] }>(
    `with reasons(position_id, reason) as (
       select id, status from vine_positions where block_id = ? and status in ('missing', 'dead')
       union all
       select o.position_id, case when o.data->>'state' = 'missing' then 'recorded-missing' else 'recorded-dead' end
         from observations o
        where ${live} and o.kind = 'missing-vine' and o.status = 'open' and o.data->>'state' in ('missing', 'dead')
       ${flagged}
     ), first_reason as (
       select distinct on (position_id) position_id, reason from reasons
        order by position_id, array_position(array['missing', 'dead', 'recorded-missing', 'recorded-dead', 'flagged'], reason)
     )
     select vp.row_number as row, vp.position, v.clone, v.rootstock, r.reason
       from first_reason r
       join vine_positions vp on vp.id = r.position_id and vp.block_id = ?
       left join lateral (select clone, rootstock from vines where position_id = vp.id order by planting_year desc nulls last, created_at desc limit 1) v on true
      order by vp.row_number, vp.position`,
    [blockId, ...liveArgs(organisationId, blockId, period), ...(withFlags ? [organisationId, blockId] : []), blockId],
  );
  return rows;
}

/** The block's tasks that belong to the season: made in it, closed in it, or still open from before. Null without a tasks table. */
export async function listSeasonTasks(db: Db, organisationId: string, blockId: string, { from, to }: SeasonBounds): Promise<TaskRow[] | null> {
  if (!(await tableExists(db, 'tasks'))) return null;
  const { rows } = await db.raw<{ rows: (Omit<TaskRow, 'dueOn' | 'closedAt'> & { dueOn: string | null; closedAt: Date | null })[] }>(
    `select t.id, t.title, t.status, t.priority, to_char(t.due_on, 'YYYY-MM-DD') as "dueOn", coalesce(u.name, u.email) as assignee,
            (select count(*)::int from task_items i where i.task_id = t.id) as items,
            (select count(*)::int from task_items i where i.task_id = t.id and i.status = 'done') as "itemsDone",
            t.closed_at as "closedAt"
       from tasks t left join users u on u.id = t.assignee_id
      where t.organisation_id = ? and t.block_id = ? and t.created_at < ?
        and (t.created_at >= ? or t.status = 'open' or t.closed_at >= ?)
      order by case t.status when 'open' then 0 when 'done' then 1 else 2 end, t.due_on nulls last, t.created_at`,
    [organisationId, blockId, to, from, from],
  );
  return rows.map((r) => ({ ...r, closedAt: r.closedAt ? r.closedAt.toISOString() : null }));
}

/**
 * Vines with the same kind at "watch" or worse in both seasons: how many of each kind, and the
 * worst of them now. One pass over both seasons' records, grouped by vine and kind, with no join
 * for a planner to misjudge.
 */
export async function listPersistedProblems(db: Db, organisationId: string, blockId: string, now: SeasonBounds, before: SeasonBounds, limit = 100) {
  const { rows } = await db.raw<{ rows: { vines: (PersistedVine & { total: number })[]; kinds: { kind: string; vines: number }[] }[] }>(
    `with persisted as materialized (
       select row_number, position, kind, before, now
         from (select o.row_number, o.position, o.kind,
                      max(o.severity) filter (where o.observed_at >= ? and o.observed_at < ?) as before,
                      max(o.severity) filter (where o.observed_at >= ? and o.observed_at < ?) as now
                 from observations o
                where o.organisation_id = ? and o.block_id = ? and o.deleted_at is null and o.severity >= 1 and o.kind <> 'note'
                  and ((o.observed_at >= ? and o.observed_at < ?) or (o.observed_at >= ? and o.observed_at < ?))
                group by o.row_number, o.position, o.kind) v
        where before is not null and now is not null
     )
     select
       (select coalesce(json_agg(json_build_object('row', row_number, 'position', position, 'kind', kind, 'before', before, 'now', now) order by now desc, before desc, row_number, position, kind), '[]')
          from (select * from persisted order by now desc, before desc, row_number, position, kind limit ?) worst) as vines,
       (select coalesce(json_agg(json_build_object('kind', kind, 'vines', n) order by n desc, kind), '[]')
          from (select kind, count(*)::int as n from persisted group by kind) k) as kinds`,
    [before.from, before.to, now.from, now.to, organisationId, blockId, before.from, before.to, now.from, now.to, limit],
  );
  const { vines, kinds } = rows[0]!;
  return { total: kinds.reduce((a, k) => a + k.vines, 0), byKind: kinds, vines };
}

export interface ExportCursor {
  observedAt: string;
  id: string;
}

/**
 * One page of the observation export, oldest first, after `cursor`. Keyset pages by (observed_at,
 * id) cost the same at the last page as at the first, and nothing holds more than one page.
 */
export async function listExportPage(
  db: Db,
  organisationId: string,
  { from, to }: SeasonBounds,
  blockId: string | undefined,
  cursor: ExportCursor | null,
  limit: number,
): Promise<(ExportRow & { cursorAt: string })[]> {
  const where = ['o.organisation_id = ?', 'o.deleted_at is null', 'o.observed_at >= ?', 'o.observed_at < ?'];
  const args: unknown[] = [organisationId, from, to];
  if (blockId) {
    where.push('o.block_id = ?');
    args.push(blockId);
  }
  if (cursor) {
    where.push('(o.observed_at, o.id) > (?::timestamptz, ?::uuid)');
    args.push(cursor.observedAt, cursor.id);
  }
  // The cursor keeps PostgreSQL's microseconds, which a JavaScript Date would round away.
  const { rows } = await db.raw<{ rows: (ExportRow & { cursorAt: string })[] }>(
    `select o.id, to_char(o.observed_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"') as "cursorAt", o.block_id as "blockId", b.name as "blockName", o.row_number as row, o.position, o.kind, o.severity, o.status,
            o.observed_at as "observedAt", o.closed_at as "closedAt", coalesce(u.name, u.email) as "recordedBy", o.note, o.data
       from observations o
       join blocks b on b.id = o.block_id
       left join users u on u.id = o.recorded_by
      where ${where.join(' and ')}
      order by o.observed_at, o.id
      limit ?`,
    [...args, limit] as never[],
  );
  return rows;
}
