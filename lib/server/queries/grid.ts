import 'server-only';
import { dayAfter, type GridFilters } from '@/lib/grid/filters';
import type { KindCounts } from '@/lib/grid/summary';
import type { Db } from '@/lib/server/db';

export interface GridData {
  /** Row numbers in the block's display order. */
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

/**
 * Positions with an open flag. Flags arrive with the flags and tasks feature; until its table exists
 * no vine is flagged, so "flagged only" rightly matches nothing. Replace the body with a subquery
 * on that table (scoped by organisation and block) and the grid and its summary follow.
 */
function flaggedPositions(_organisationId: string, _blockId: string): Fragment {
  return { sql: 'select null::uuid where false', bindings: [] };
}

/**
 * The block's grid and summary counts in one statement, the filters applied in SQL. Date range and
 * person scope every figure; kind, status and "flagged" choose the findings that colour a vine, so
 * "vines scouted" (the incidence denominator) is every vine with any record in the period.
 */
export function gridStatement(organisationId: string, blockId: string, rowOrder: 'ascending' | 'descending', f: GridFilters): Fragment {
  const scope = ['o.organisation_id = ?', 'o.block_id = ?', 'o.deleted_at is null'];
  const scopeArgs: unknown[] = [organisationId, blockId];
  if (f.from) {
    scope.push('o.observed_at >= ?');
    scopeArgs.push(`${f.from}T00:00:00Z`);
  }
  if (f.to) {
    scope.push('o.observed_at < ?');
    scopeArgs.push(dayAfter(f.to));
  }
  if (f.by) {
    scope.push('o.recorded_by = ?');
    scopeArgs.push(f.by);
  }
  const match: string[] = [];
  const matchArgs: unknown[] = [];
  if (f.status !== 'all') {
    match.push('o.status = ?');
    matchArgs.push(f.status);
  }
  if (f.kind.length) {
    match.push(`o.kind in (${f.kind.map(() => '?').join(', ')})`);
    matchArgs.push(...f.kind);
  }
  if (f.flagged) {
    const flagged = flaggedPositions(organisationId, blockId);
    match.push(`o.position_id in (${flagged.sql})`);
    matchArgs.push(...flagged.bindings);
  }
  const order = rowOrder === 'descending' ? 'desc' : 'asc';
  const sql = `
    with scoped as (
      select o.position_id, o.kind, o.severity, (${match.length ? match.join(' and ') : 'true'}) as hit
      from observations o
      where ${scope.join(' and ')}
    ), seen as materialized (
      select position_id, kind,
        max(severity) filter (where hit) as worst,
        count(*) filter (where hit and severity = 0)::int as s0,
        count(*) filter (where hit and severity = 1)::int as s1,
        count(*) filter (where hit and severity = 2)::int as s2,
        count(*) filter (where hit and severity = 3)::int as s3
      from scoped
      group by position_id, kind
    ), worst as (
      select position_id, max(worst) as worst from seen group by position_id
    ), grid as (
      select r.row_number,
        json_agg(
          coalesce(case vp.status when 'planted' then 0 when 'replant' then 1 when 'missing' then 2 when 'dead' then 3 end, 4) * 5
          + coalesce(w.worst + 1, 0)
          order by g.position) as codes
      from block_rows r
      cross join lateral generate_series(1, r.vine_count) as g(position)
      left join vine_positions vp on vp.block_id = r.block_id and vp.row_number = r.row_number and vp.position = g.position
      left join worst w on w.position_id = vp.id
      where r.block_id = ?
      group by r.row_number
    )
    select
      (select coalesce(json_agg(json_build_array(row_number, codes) order by row_number ${order}), '[]') from grid) as cells,
      (select coalesce(json_agg(json_build_object('kind', kind, 'bySeverity', json_build_array(s0, s1, s2, s3), 'vinesAffected', affected) order by kind), '[]')
        from (select kind, sum(s0)::int as s0, sum(s1)::int as s1, sum(s2)::int as s2, sum(s3)::int as s3,
                count(*) filter (where worst >= 1)::int as affected
              from seen where worst is not null group by kind) k) as kinds,
      (select count(distinct position_id)::int from seen) as scouted`;
  return { sql, bindings: [...matchArgs, ...scopeArgs, blockId] };
}

export async function loadGrid(db: Db, organisationId: string, blockId: string, rowOrder: 'ascending' | 'descending', f: GridFilters): Promise<GridData> {
  const { sql, bindings } = gridStatement(organisationId, blockId, rowOrder, f);
  const result = await db.raw(sql, bindings as never[]);
  const row = result.rows[0] as { cells: [number, number[]][]; kinds: KindCounts[]; scouted: number };
  return {
    rows: row.cells.map(([n]) => n),
    cells: row.cells.map(([, codes]) => codes),
    kinds: row.kinds,
    vinesScouted: row.scouted,
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
      db.raw(`(select count(distinct o.position_id)::int from observations o where o.block_id = b.id and o.organisation_id = b.organisation_id
        and o.deleted_at is null and o.status = 'open' and o.severity >= 2) as "actVines"`),
      db.raw(`(select count(distinct o.position_id)::int from observations o where o.block_id = b.id and o.organisation_id = b.organisation_id
        and o.deleted_at is null and o.status = 'open' and o.severity = 3) as "urgentVines"`),
    );
}

export interface VineRow {
  positionId: string;
  blockId: string;
  blockName: string;
  trainingSystem: string;
  vinesPerPanel: number | null;
  positionOrigin: string | null;
  row: number;
  position: number;
  status: 'planted' | 'missing' | 'dead' | 'replant';
  replantYear: number | null;
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
    });
}

/** One planting slot of this organisation, or undefined: never another organisation's. */
export function getVine(db: Db, organisationId: string, positionId: string) {
  return vineQuery(db, organisationId).andWhere('vp.id', positionId);
}

export function findVineByAddress(db: Db, organisationId: string, blockId: string, row: number, position: number) {
  return vineQuery(db, organisationId).andWhere({ 'vp.block_id': blockId, 'vp.row_number': row, 'vp.position': position });
}

export interface PlantingRow {
  plantingYear: number | null;
  clone: string | null;
  rootstock: string | null;
  removedYear: number | null;
  removalReason: string | null;
}

/** The vines that stood in a slot over the years, oldest first. */
export function listPlantings(db: Db, positionId: string): Promise<PlantingRow[]> {
  return db('vines')
    .where('position_id', positionId)
    .orderByRaw('planting_year nulls first, created_at')
    .select({ plantingYear: 'planting_year', clone: 'clone', rootstock: 'rootstock', removedYear: 'removed_year', removalReason: 'removal_reason' });
}

export interface VineObservationRow {
  id: string;
  kind: string;
  data: Record<string, unknown>;
  note: string;
  observedAt: Date;
  severity: number;
  status: 'open' | 'closed';
  closedAt: Date | null;
  recordedBy: string | null;
  recordedByName: string | null;
}

/** Every live observation of a vine, newest first, open and closed. */
export function listVineObservations(db: Db, organisationId: string, positionId: string): Promise<VineObservationRow[]> {
  return db('observations as o')
    .leftJoin('users as u', 'u.id', 'o.recorded_by')
    .where({ 'o.organisation_id': organisationId, 'o.position_id': positionId })
    .whereNull('o.deleted_at')
    .orderBy([{ column: 'o.observed_at', order: 'desc' }, { column: 'o.id', order: 'desc' }])
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

export interface ObservationPhotoRow {
  id: string;
  observationId: string;
  width: number | null;
  height: number | null;
  takenAt: Date;
}

export function listObservationPhotos(db: Db, organisationId: string, observationIds: string[]): Promise<ObservationPhotoRow[]> {
  if (observationIds.length === 0) return Promise.resolve([]);
  return db('photos')
    .where({ organisation_id: organisationId, status: 'stored' })
    .whereIn('observation_id', observationIds)
    .orderByRaw('coalesce(taken_at, created_at) desc, id desc')
    .select({ id: 'id', observationId: 'observation_id', width: 'width', height: 'height', takenAt: db.raw('coalesce(taken_at, created_at)') });
}

export interface VineNote {
  id: string;
  text: string;
  by: string | null;
  at: Date;
}

/**
 * Flags and comments on a vine. They arrive with the flags, tasks and comments feature; until its
 * tables exist a vine has none, and the panel shows those sections only when there is something in them.
 */
export async function listVineFlags(_db: Db, _organisationId: string, _positionId: string): Promise<VineNote[]> {
  return [];
}

export async function listVineComments(_db: Db, _organisationId: string, _positionId: string): Promise<VineNote[]> {
  return [];
}
