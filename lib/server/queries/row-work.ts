import 'server-only';
import type { Db } from '@/lib/server/db';
import type { PayBasis } from '@/lib/work/cost';
import type { LeadCoverage, ProgressBlock, RowCoverage } from '@/lib/work/progress';
import type { RowWorkPass } from '@/lib/work/passes';

export interface RowWorkInsert {
  id: string;
  organisation_id: string;
  block_id: string;
  row_number: number;
  pass: RowWorkPass;
  from_position: number | null;
  to_position: number | null;
  crew_size: number;
  person_hours: number;
  started_at: string | null;
  finished_at: string;
  note: string;
  recorded_by: string;
  payload_sha256: string;
}

/** Inserts a batch once by id in one statement; answers the ids that were new. */
export async function insertRowWorkOnce(db: Db, rows: RowWorkInsert[]): Promise<Set<string>> {
  if (rows.length === 0) return new Set();
  const inserted = await db('row_work').insert(rows).onConflict('id').ignore().returning('id');
  return new Set(inserted.map((r: { id: string }) => r.id));
}

export function getStoredRowWorkHashes(db: Db, ids: string[]) {
  if (ids.length === 0) return Promise.resolve([]);
  return db('row_work').whereIn('id', ids).select<{ id: string; organisation_id: string; payload_sha256: string }[]>('id', 'organisation_id', 'payload_sha256');
}

/** The rows (and their lengths) of this organisation's blocks among the given block/row pairs, in one query. */
export async function resolveRows(db: Db, organisationId: string, keys: { blockId: string; row: number }[]) {
  if (keys.length === 0) return new Map<string, number>();
  const found = await db.raw<{ rows: { block_id: string; row_number: number; vine_count: number }[] }>(
    `select r.block_id, r.row_number, r.vine_count
       from unnest(?::uuid[], ?::int[]) as k(block_id, row_number)
       join block_rows r on r.block_id = k.block_id and r.row_number = k.row_number
       join blocks b on b.id = r.block_id and b.organisation_id = ?`,
    [keys.map((k) => k.blockId), keys.map((k) => k.row), organisationId],
  );
  return new Map(found.rows.map((r) => [`${r.block_id}:${r.row_number}`, r.vine_count]));
}

/** Each owned block's row count, for the message about a row past the block. */
export async function blockRowCounts(db: Db, organisationId: string, blockIds: string[]) {
  if (blockIds.length === 0) return new Map<string, number>();
  const rows = await db('blocks').where({ organisation_id: organisationId }).whereIn('id', blockIds).select<{ id: string; row_count: number }[]>('id', 'row_count');
  return new Map(rows.map((r) => [r.id, r.row_count]));
}

export async function getPayBasis(db: Db, organisationId: string): Promise<PayBasis & { seasonStartMonth: number }> {
  const org = await db('organisations').where({ id: organisationId }).first('pay_basis', 'hourly_rate', 'piece_rate_per_vine', 'season_start_month');
  return {
    basis: org?.pay_basis ?? 'hourly',
    hourlyRate: org?.hourly_rate === null || org?.hourly_rate === undefined ? null : Number(org.hourly_rate),
    pieceRatePerVine: org?.piece_rate_per_vine === null || org?.piece_rate_per_vine === undefined ? null : Number(org.piece_rate_per_vine),
    seasonStartMonth: org?.season_start_month ?? 1,
  };
}

export async function setPayBasis(db: Db, organisationId: string, pay: PayBasis) {
  await db('organisations')
    .where({ id: organisationId })
    .update({ pay_basis: pay.basis, hourly_rate: pay.hourlyRate, piece_rate_per_vine: pay.pieceRatePerVine });
}

/** The organisation's active blocks (or the named ones), with their rows and standing vines. */
export async function listProgressBlocks(db: Db, organisationId: string, blockIds?: string[]): Promise<ProgressBlock[]> {
  const found = await db.raw<{ rows: { id: string; name: string; training_system: ProgressBlock['trainingSystem']; rows: number[]; standing: number }[] }>(
    `select b.id, b.name, b.training_system,
            (select array_agg(r.row_number order by r.row_number) from block_rows r where r.block_id = b.id) as rows,
            ((select coalesce(sum(r.vine_count), 0) from block_rows r where r.block_id = b.id)
              - (select count(*) from vine_positions p where p.block_id = b.id and p.status in ('missing', 'dead')))::int as standing
       from blocks b
      where b.organisation_id = ? and ${blockIds ? 'b.id = any(?::uuid[])' : 'b.archived_at is null'}
      order by lower(b.name)`,
    blockIds ? [organisationId, blockIds] : [organisationId],
  );
  return found.rows.map((b) => ({ id: b.id, name: b.name, trainingSystem: b.training_system, rows: b.rows ?? [], vineCount: b.standing }));
}

export interface Period {
  from: string;
  to: string;
}

/**
 * Coverage per block, pass and row, and per crew lead, in one statement. The runs of a row merge
 * into one multirange, so overlapping runs count each vine once. Every position of a row is a slot
 * (1 … vine_count), so the standing vines covered are the positions the multirange holds less the
 * gaps (missing and dead slots) inside it, read once per row from their partial index.
 */
export async function countCoverage(db: Db, organisationId: string, blockIds: string[], period: Period) {
  const result = await db.raw<{
    rows: { block_id: string; pass: RowWorkPass; row_number: number; recorded_by: string | null; by_lead: boolean; name: string | null; hours: number; whole: boolean; vines: number }[];
  }>(
    `with runs as (
       select w.block_id, w.pass, w.row_number, w.recorded_by, w.person_hours,
              case when coalesce(w.from_position, 1) > r.vine_count then 'empty'::int4range
                   else int4range(coalesce(w.from_position, 1), least(coalesce(w.to_position, r.vine_count), r.vine_count), '[]') end as span
         from row_work w
         join block_rows r on r.block_id = w.block_id and r.row_number = w.row_number
        where w.organisation_id = ? and w.block_id = any(?::uuid[]) and w.finished_at >= ? and w.finished_at < ?
     ), grouped as (
       select block_id, pass, row_number, recorded_by, grouping(recorded_by) = 0 as by_lead,
              range_agg(span) as covered, sum(person_hours)::float8 as hours
         from runs
        group by grouping sets ((block_id, pass, row_number), (block_id, pass, row_number, recorded_by))
     ), gaps as (
       select block_id, row_number, array_agg(position) as positions
         from vine_positions
        where block_id = any(?::uuid[]) and status in ('missing', 'dead')
        group by block_id, row_number
     )
     select g.block_id, g.pass, g.row_number, g.recorded_by, g.by_lead, u.name, g.hours,
            g.covered @> int4range(1, r.vine_count, '[]') as whole,
            ((select coalesce(sum(upper(x) - lower(x)), 0) from unnest(g.covered) x)
              - (select count(*) from unnest(gaps.positions) p where g.covered @> p))::int as vines
       from grouped g
       join block_rows r on r.block_id = g.block_id and r.row_number = g.row_number
       left join gaps on gaps.block_id = g.block_id and gaps.row_number = g.row_number
       left join users u on u.id = g.recorded_by`,
    [organisationId, blockIds, period.from, period.to, blockIds],
  );
  const rows = new Map<string, RowCoverage[]>();
  const leads = new Map<string, Map<string, LeadCoverage>>();
  for (const r of result.rows) {
    if (!r.by_lead) {
      const list = rows.get(r.block_id) ?? [];
      list.push({ pass: r.pass, row: r.row_number, vines: r.vines, whole: r.whole, personHours: r.hours });
      rows.set(r.block_id, list);
      continue;
    }
    const ofBlock = leads.get(r.block_id) ?? new Map<string, LeadCoverage>();
    const key = `${r.pass}:${r.recorded_by}`;
    const lead = ofBlock.get(key) ?? { pass: r.pass, userId: r.recorded_by, name: r.name, vines: 0, personHours: 0 };
    lead.vines += r.vines;
    lead.personHours += r.hours;
    ofBlock.set(key, lead);
    leads.set(r.block_id, ofBlock);
  }
  return { rows, leads: new Map([...leads].map(([k, v]) => [k, [...v.values()]])) };
}

/** Days worked per block and pass (UTC days of the finish). */
export async function listWorkDays(db: Db, organisationId: string, blockIds: string[], period: Period) {
  const result = await db.raw<{ rows: { block_id: string; pass: RowWorkPass; days: string[] }[] }>(
    `select block_id, pass, array_agg(distinct to_char(finished_at at time zone 'UTC', 'YYYY-MM-DD')) as days
       from row_work
      where organisation_id = ? and block_id = any(?::uuid[]) and finished_at >= ? and finished_at < ?
      group by block_id, pass`,
    [organisationId, blockIds, period.from, period.to],
  );
  const days = new Map<string, Partial<Record<RowWorkPass, string[]>>>();
  for (const r of result.rows) days.set(r.block_id, { ...days.get(r.block_id), [r.pass]: r.days });
  return days;
}

/** Rows done end to end per pass in one block and period, for the phone. */
export async function listDoneRows(db: Db, organisationId: string, blockId: string, period: Period) {
  const result = await db.raw<{ rows: { pass: RowWorkPass; rows: number[] }[] }>(
    `select pass, array_agg(row_number order by row_number) as rows from (
       select w.pass, w.row_number
         from row_work w join block_rows r on r.block_id = w.block_id and r.row_number = w.row_number
        where w.organisation_id = ? and w.block_id = ? and w.finished_at >= ? and w.finished_at < ?
        group by w.pass, w.row_number, r.vine_count
       having range_agg(case when coalesce(w.from_position, 1) > r.vine_count then 'empty'::int4range
                   else int4range(coalesce(w.from_position, 1), least(coalesce(w.to_position, r.vine_count), r.vine_count), '[]') end)
              @> int4range(1, r.vine_count, '[]')
     ) done group by pass`,
    [organisationId, blockId, period.from, period.to],
  );
  return Object.fromEntries(result.rows.map((r) => [r.pass, r.rows])) as Partial<Record<RowWorkPass, number[]>>;
}

export interface RowWorkExportRow {
  id: string;
  block: string;
  row_number: number;
  pass: RowWorkPass;
  from_position: number | null;
  to_position: number | null;
  crew_size: number;
  person_hours: string;
  started_at: Date | null;
  finished_at: Date;
  note: string;
  recorded_by: string | null;
}

export function listRowWorkForExport(db: Db, organisationId: string, period: Period, blockId?: string) {
  const q = db('row_work as w')
    .join('blocks as b', 'b.id', 'w.block_id')
    .leftJoin('users as u', 'u.id', 'w.recorded_by')
    .where('w.organisation_id', organisationId)
    .where('w.finished_at', '>=', period.from)
    .where('w.finished_at', '<', period.to)
    .orderBy([{ column: 'b.name' }, { column: 'w.finished_at' }, { column: 'w.id' }])
    .select<RowWorkExportRow[]>(
      'w.id',
      'b.name as block',
      'w.row_number',
      'w.pass',
      'w.from_position',
      'w.to_position',
      'w.crew_size',
      'w.person_hours',
      'w.started_at',
      'w.finished_at',
      'w.note',
      db.raw('coalesce(u.name, u.email) as recorded_by'),
    );
  if (blockId) q.where('w.block_id', blockId);
  return q;
}
