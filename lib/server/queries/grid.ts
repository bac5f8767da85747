import 'server-only';
import { GRID_KINDS, kindCounts, rowCodes, vinesPerKind, type RawGridRow } from '@/lib/grid/cells';
import { dayAfter, type GridFilters } from '@/lib/grid/filters';
import type { KindCounts } from '@/lib/grid/summary';
import type { Planting, VineNote, VineObservation, VinePhoto, VineRow } from '@/lib/contracts/grid';

export type { VineRow };
import type { Db } from '@/lib/server/db';
import { listComments } from '@/lib/server/queries/comments';
import { listFlagsOnVine, openFlagPositionsSql } from '@/lib/server/queries/flags';
import { REASON_LABELS } from '@/lib/validation/flag';

export interface GridData {
  /** Row numbers, ascending; the caller lays them out in the block's own order. */
  rows: number[];
  /** Per row, one cell code (lib/grid/cells.ts) for each position from 1. */
  cells: number[][];
  kinds: KindCounts[];
  vinesScouted: number;
}

interface Fragment {
  sql: string;
  bindings: unknown[];
}

export interface GridStatements {
  cells: Fragment;
  counts: Fragment;
}

/** Where the grid is read from: the standing per-vine summary, or the observations themselves. */
export type GridSource = 'summary' | 'observations';

/**
 * The summary (grid_vines, grid_counts; see db/migrations/20261202-01-grid-summary.ts) knows each
 * vine's worst finding per kind and status, but not when or by whom: a date range or a person
 * needs the observations to colour the vines. Its counts are kept per day and person, so they
 * answer every filter but "flagged", which depends on where each observation stands.
 */
export const gridSource = (f: GridFilters): GridSource => (f.from || f.to || f.by ? 'observations' : 'summary');

/**
 * The block's grid and summary counts in two statements, the filters applied in SQL: one reads each
 * vine's worst finding (and the grid's rows and slots), the other counts findings by kind and
 * severity. Date range and person scope every figure; kind, status and "flagged" choose the findings
 * that colour a vine, so "vines scouted" (the incidence denominator) is every vine with any record in
 * the period but a missing-vine one (a hole is found without looking at a vine; the season report
 * counts the same way). Both sources give the same answer (a test holds them equal); `source` forces one.
 */
export function gridStatements(organisationId: string, blockId: string, f: GridFilters, source?: GridSource): GridStatements {
  const cellsFrom = source ?? gridSource(f);
  if (cellsFrom === 'summary' && gridSource(f) === 'observations') throw new Error('The grid summary cannot answer a date or person filter');
  const countsFrom = f.flagged ? 'observations' : (source ?? 'summary');
  return {
    cells: cellsFrom === 'summary' ? summaryCells(organisationId, blockId, f) : observationCells(organisationId, blockId, f),
    counts: countsFrom === 'summary' ? summaryCounts(organisationId, blockId, f) : observationCounts(organisationId, blockId, f),
  };
}

/** The live observations in the period and of the person the filters name. */
function observationScope(organisationId: string, blockId: string, f: GridFilters): Fragment {
  const scope = ['o.organisation_id = ?', 'o.block_id = ?', 'o.deleted_at is null'];
  const bindings: unknown[] = [organisationId, blockId];
  if (f.from) {
    scope.push('o.observed_at >= ?');
    bindings.push(`${f.from}T00:00:00Z`);
  }
  if (f.to) {
    scope.push('o.observed_at < ?');
    bindings.push(dayAfter(f.to));
  }
  if (f.by) {
    scope.push('o.recorded_by = ?');
    bindings.push(f.by);
  }
  return { sql: scope.join(' and '), bindings };
}

/** Among those, the findings that colour a vine. */
function observationMatch(organisationId: string, blockId: string, f: GridFilters): Fragment {
  const match: string[] = [];
  const bindings: unknown[] = [];
  if (f.status !== 'all') {
    match.push('o.status = ?');
    bindings.push(f.status);
  }
  if (f.kind.length) {
    match.push(`o.kind in (${f.kind.map(() => '?').join(', ')})`);
    bindings.push(...f.kind);
  }
  if (f.flagged) {
    const flagged = openFlagPositionsSql(organisationId, blockId);
    match.push(`o.position_id in (${flagged.sql})`);
    bindings.push(...flagged.bindings);
  }
  return { sql: match.length ? match.join(' and ') : 'true', bindings };
}

/**
 * A block's slots per row: slots not planted (position × 4 + slot index), the positions present
 * when the row has gaps (rows normally run 1…last), and the last position.
 */
const SLOT_COLUMNS = `
  json_agg(position * 4 + case status when 'replant' then 1 when 'missing' then 2 else 3 end) filter (where status <> 'planted') as slots,
  case when count(*) = max(position) then null else json_agg(position) end as present,
  max(position) as last`;

/**
 * Per vine: its worst matching severity, and a bit per kind found at "watch" or worse (bit i + 1 for
 * the kind at place i of GRID_KINDS); per row, packed as position × 4 + worst and position × 65536
 * + kind bits (lib/grid/cells.ts reads them). One row at a time (lateral), so each step reads a
 * short run of the block's slot index in vine order, whatever the planner thinks of the table.
 */
function observationCells(organisationId: string, blockId: string, f: GridFilters): Fragment {
  const scope = observationScope(organisationId, blockId, f);
  const hit = observationMatch(organisationId, blockId, f);
  const sql = `
    select r.row_number, r.vine_count, sl.slots, sl.present, v.worst, coalesce(sl.last, 0) as last, v.kinds, v.scouted
    from block_rows r
    left join (select row_number, ${SLOT_COLUMNS} from vine_positions where block_id = ? group by row_number) sl on sl.row_number = r.row_number
    cross join lateral (
      select json_agg(position * 4 + worst) filter (where worst is not null) as worst,
        json_agg(position * 65536 + kinds) filter (where kinds is not null) as kinds,
        count(*) filter (where looked)::int as scouted
      from (
        select position,
          bool_or(kind <> 'missing-vine') as looked,
          max(severity) filter (where hit) as worst,
          bit_or(1 << coalesce(array_position(?::text[], kind), 0)) filter (where hit and severity >= 1) as kinds
        from (
          select o.position, o.kind, o.severity, (${hit.sql}) as hit from observations o
          where o.row_number = r.row_number and ${scope.sql}
        ) s
        group by position
      ) vines
    ) v
    where r.block_id = ?
    order by r.row_number`;
  return { sql, bindings: [blockId, GRID_KINDS, ...hit.bindings, ...scope.bindings, blockId] };
}

/** Every kind's three bits but a missing-vine record's: a vine was looked at when any of them is set. */
const LOOKED_MASK = 2 ** (3 * GRID_KINDS.length) - 1 - 7 * 2 ** (3 * GRID_KINDS.indexOf('missing-vine'));

/**
 * The same cells from grid_vines: one row per vine with its worst level and kind bits kept for open
 * and closed findings (level 0 = none, 1–4 = severity 0–3). A kind filter reads the chosen kinds'
 * levels from the packed columns, three bits per kind at the place GRID_KINDS gives it (a test holds
 * it equal to the database's grid_kind_index); those places are integers made here, never input.
 */
function summaryCells(organisationId: string, blockId: string, f: GridFilters): Fragment {
  const columns = f.status === 'all' ? ['open', 'closed'] : [f.status];
  let worst: string;
  let kinds: string;
  if (f.kind.length) {
    const places = f.kind.map((kind) => GRID_KINDS.indexOf(kind));
    worst = `greatest(${places.flatMap((i) => columns.map((c) => `((g.${c}_levels >> ${3 * i}) & 7)`)).join(', ')})`;
    const mask = places.reduce((bits, i) => bits | (2 ** (i + 1)), 0);
    kinds = `(${columns.map((c) => `g.${c}_kinds`).join(' | ')}) & ${mask}`;
  } else {
    worst = columns.length > 1 ? 'greatest(g.open_worst, g.closed_worst)' : `g.${columns[0]}_worst`;
    kinds = columns.map((c) => `g.${c}_kinds`).join(' | ');
  }
  worst = `nullif(${worst}, 0) - 1`;
  kinds = `nullif(${kinds}, 0)`;
  const bindings: unknown[] = [];
  if (f.flagged) {
    const flagged = openFlagPositionsSql(organisationId, blockId);
    const on = `vp.id in (${flagged.sql})`;
    worst = `case when ${on} then ${worst} end`;
    kinds = `case when ${on} then ${kinds} end`;
    bindings.push(...flagged.bindings, ...flagged.bindings);
  }
  const sql = `
    select r.row_number, r.vine_count, v.slots, v.present, v.worst, coalesce(v.last, 0) as last, v.kinds, coalesce(v.scouted, 0) as scouted
    from block_rows r
    left join (
      select row_number, ${SLOT_COLUMNS},
        json_agg(position * 4 + worst) filter (where worst is not null) as worst,
        json_agg(position * 65536 + kinds) filter (where kinds is not null) as kinds,
        count(*) filter (where looked)::int as scouted
      from (
        select vp.row_number, vp.position, vp.status, ((g.open_levels | g.closed_levels) & ${LOOKED_MASK}) <> 0 as looked,
          ${worst} as worst, ${kinds} as kinds
        -- By block as well as slot, so the block's own index is read, not every vine of the organisation.
        from vine_positions vp left join grid_vines g on g.position_id = vp.id and g.organisation_id = ? and g.block_id = ?
        where vp.block_id = ?
      ) s
      group by row_number
    ) v on v.row_number = r.row_number
    where r.block_id = ?
    order by r.row_number`;
  return { sql, bindings: [...bindings, organisationId, blockId, blockId, blockId] };
}

const countsOf = (from: string) => `select coalesce(json_agg(json_build_array(kind, severity, n)), '[]') as counts from (${from}) c`;

function observationCounts(organisationId: string, blockId: string, f: GridFilters): Fragment {
  const scope = observationScope(organisationId, blockId, f);
  const hit = observationMatch(organisationId, blockId, f);
  return {
    sql: countsOf(`select o.kind, o.severity, count(*)::int as n from observations o where ${scope.sql} and ${hit.sql} group by o.kind, o.severity`),
    bindings: [...scope.bindings, ...hit.bindings],
  };
}

/** Counts from grid_counts, kept per UTC day and person, so dates and people filter them too. */
function summaryCounts(organisationId: string, blockId: string, f: GridFilters): Fragment {
  const where = ['c.organisation_id = ?', 'c.block_id = ?'];
  const bindings: unknown[] = [organisationId, blockId];
  if (f.from) {
    where.push('c.day >= ?');
    bindings.push(f.from);
  }
  if (f.to) {
    where.push('c.day <= ?');
    bindings.push(f.to);
  }
  if (f.by) {
    where.push('c.recorded_by = ?');
    bindings.push(f.by);
  }
  if (f.status !== 'all') {
    where.push('c.status = ?');
    bindings.push(f.status);
  }
  if (f.kind.length) {
    where.push(`c.kind in (${f.kind.map(() => '?').join(', ')})`);
    bindings.push(...f.kind);
  }
  return {
    sql: countsOf(`select kind, severity, sum(n)::int as n from grid_counts c where ${where.join(' and ')} group by kind, severity having sum(n) > 0`),
    bindings,
  };
}

interface CellsRow {
  row_number: number;
  vine_count: number;
  slots: number[] | null;
  present: number[] | null;
  worst: number[] | null;
  last: number;
  kinds: number[] | null;
  scouted: number;
}

/**
 * Runs the grid's two statements side by side (on two connections when there are two). The cells
 * come as one result row per grid row, not one JSON text of the block: that text (280 KB for
 * 22,500 vines) was allocated straight into V8's old generation and brought a full collection every
 * few grid requests, which was most of the route's p95.
 */
export async function runGridStatements(db: Db, statements: GridStatements) {
  const [cells, counts] = await Promise.all([
    db.raw(statements.cells.sql, statements.cells.bindings as never[]),
    db.raw(statements.counts.sql, statements.counts.bindings as never[]),
  ]);
  return {
    rows: (cells.rows as CellsRow[]).map((r): RawGridRow => [r.row_number, r.vine_count, r.slots, r.present, r.worst, r.last, r.kinds, r.scouted]),
    counts: (counts.rows[0] as { counts: [string, number, number][] }).counts,
  };
}

export async function loadGrid(db: Db, organisationId: string, blockId: string, f: GridFilters, source?: GridSource): Promise<GridData> {
  const { rows, counts } = await runGridStatements(db, gridStatements(organisationId, blockId, f, source));
  return {
    rows: rows.map(([n]) => n),
    cells: rows.map(rowCodes),
    kinds: kindCounts(GRID_KINDS, counts, vinesPerKind(rows, GRID_KINDS.length)),
    vinesScouted: rows.reduce((sum, row) => sum + row[7], 0),
  };
}

export interface GridBlock {
  id: string;
  name: string;
  variety: string;
  rowCount: number;
  vinesPerRow: number;
  actVines: number;
  urgentVines: number;
}

/** The organisation's blocks for the grid's picker, with how many vines need action now or this season. */
export function listGridBlocks(db: Db, organisationId: string): Promise<GridBlock[]> {
  return db('blocks as b')
    .where('b.organisation_id', organisationId)
    .whereNull('b.archived_at')
    .orderBy('b.name')
    .select({
      id: 'b.id',
      name: 'b.name',
      variety: 'b.variety',
      rowCount: 'b.row_count',
      vinesPerRow: 'b.vines_per_row',
    })
    .select(
      db.raw(`(select count(*)::int from grid_vines g where g.block_id = b.id and g.organisation_id = b.organisation_id and g.open_worst >= 3) as "actVines"`),
      db.raw(
        `(select count(*)::int from grid_vines g where g.block_id = b.id and g.organisation_id = b.organisation_id and g.open_worst = 4) as "urgentVines"`,
      ),
    );
}

function vineQuery(db: Db, organisationId: string) {
  return db('vine_positions as vp')
    .join('blocks as b', 'b.id', 'vp.block_id')
    .where('b.organisation_id', organisationId)
    .first<VineRow | undefined>({
      positionId: 'vp.id',
      blockId: 'b.id',
      blockName: 'b.name',
      trainingSystem: 'b.training_system',
      vinesPerPanel: 'b.vines_per_panel',
      positionOrigin: 'b.position_origin',
      row: 'vp.row_number',
      position: 'vp.position',
      status: 'vp.status',
      replantYear: 'vp.replant_year',
      // A numeric column comes back as a string without the cast; knex's typed column map takes only names.
      vineSpacingM: db.raw('b.vine_spacing_m::float8') as unknown as string,
    });
}

/** One planting slot of this organisation, or undefined: never another organisation's. */
export function getVine(db: Db, organisationId: string, positionId: string) {
  return vineQuery(db, organisationId).andWhere('vp.id', positionId);
}

export function findVineByAddress(db: Db, organisationId: string, blockId: string, row: number, position: number) {
  return vineQuery(db, organisationId).andWhere({ 'vp.block_id': blockId, 'vp.row_number': row, 'vp.position': position });
}

export type PlantingRow = Planting;

/** The vines that stood in a slot over the years, oldest first. */
export function listPlantings(db: Db, positionId: string): Promise<PlantingRow[]> {
  return db('vines')
    .where('position_id', positionId)
    .orderByRaw('planting_year nulls first, created_at')
    .select({ plantingYear: 'planting_year', clone: 'clone', rootstock: 'rootstock', removedYear: 'removed_year', removalReason: 'removal_reason' });
}

export type VineObservationRow = VineObservation<Date>;

/** Every live observation of a vine, newest first, open and closed. */
export function listVineObservations(db: Db, organisationId: string, positionId: string): Promise<VineObservationRow[]> {
  return db('observations as o')
    .leftJoin('users as u', 'u.id', 'o.recorded_by')
    .where({ 'o.organisation_id': organisationId, 'o.position_id': positionId })
    .whereNull('o.deleted_at')
    .orderBy([
      { column: 'o.observed_at', order: 'desc' },
      { column: 'o.id', order: 'desc' },
    ])
    .select({
      id: 'o.id',
      kind: 'o.kind',
      data: 'o.data',
      note: 'o.note',
      observedAt: 'o.observed_at',
      severity: 'o.severity',
      status: 'o.status',
      closedAt: 'o.closed_at',
      recordedBy: 'o.recorded_by',
      recordedByName: db.raw('coalesce(u.name, u.email)'),
    });
}

export type ObservationPhotoRow = VinePhoto<Date> & { observationId: string };

export function listObservationPhotos(db: Db, organisationId: string, observationIds: string[]): Promise<ObservationPhotoRow[]> {
  if (observationIds.length === 0) return Promise.resolve([]);
  return db('photos')
    .where({ organisation_id: organisationId, status: 'stored' })
    .whereIn('observation_id', observationIds)
    .orderByRaw('coalesce(taken_at, created_at) desc, id desc')
    .select({ id: 'id', observationId: 'observation_id', width: 'width', height: 'height', takenAt: db.raw('coalesce(taken_at, created_at)') });
}

/** Open flags covering a vine, as the panel lists them: reason, note, who and when. */
export async function listVineFlags(db: Db, organisationId: string, positionId: string): Promise<VineNote<Date>[]> {
  const flags = await listFlagsOnVine(db, organisationId, positionId);
  return flags
    .filter((f) => f.status === 'open')
    .map((f) => ({
      id: f.id,
      text: `${REASON_LABELS[f.reason]}${f.toPosition > f.position ? ` (vines ${f.position}–${f.toPosition})` : ''}${f.note ? `: ${f.note}` : ''}`,
      by: f.by,
      at: f.at,
    }));
}

/** Comments on the vine itself (its findings' threads open from each finding). */
export async function listVineComments(db: Db, organisationId: string, positionId: string): Promise<VineNote<Date>[]> {
  const comments = await listComments(db, organisationId, 'vine', positionId);
  return comments.map((c) => ({ id: c.id, text: c.body, by: c.authorName, at: c.createdAt }));
}
