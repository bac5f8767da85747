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

export interface RowWorkOutcome {
  ord: number;
  inserted: boolean;
  storedOrg: string | null;
  storedHash: string | null;
  /** The block's row count when it is the member's block, else null. */
  rowCount: number | null;
  /** The row's vine count when the row exists, else null. */
  rowLength: number | null;
}

/**
 * One statement per batch: ids stored before are answered from what is stored; the new ones are
 * checked against the member's blocks and rows (a span must lie within the row) and inserted once
 * by id. Rows another transaction stored meanwhile are not seen (the statement's snapshot).
 */
export async function ingestRowWork(
  db: Db,
  organisationId: string,
  recordedBy: string,
  records: Omit<RowWorkInsert, 'organisation_id' | 'recorded_by'>[],
): Promise<RowWorkOutcome[]> {
  if (records.length === 0) return [];
  const { rows } = await db.raw<{ rows: RowWorkOutcome[] }>(
    `with input as (
       select * from jsonb_to_recordset(?::jsonb) as r(ord int, id uuid, block_id uuid, row_number int, pass text, from_position int, to_position int,
         crew_size int, person_hours numeric, started_at timestamptz, finished_at timestamptz, note text, payload_sha256 text)
     ), facts as (
       select i.*, b.row_count, br.vine_count, s.organisation_id as stored_org, s.payload_sha256 as stored_hash
       from input i
       left join row_work s on s.id = i.id
       left join blocks b on b.id = i.block_id and b.organisation_id = ?
       left join block_rows br on br.block_id = b.id and br.row_number = i.row_number
     ), ins as (
       insert into row_work (id, organisation_id, block_id, row_number, pass, from_position, to_position, crew_size, person_hours,
         started_at, finished_at, note, recorded_by, payload_sha256)
       select distinct on (id) id, ?::uuid, block_id, row_number, pass, from_position, to_position, crew_size, person_hours,
         started_at, finished_at, note, ?::uuid, payload_sha256
       from facts
       where stored_org is null and vine_count is not null
         and coalesce(from_position, 0) <= vine_count and coalesce(to_position, 0) <= vine_count
       order by id, ord
       on conflict (id) do nothing
       returning id
     )
     select f.ord, exists (select 1 from ins where ins.id = f.id) as inserted, f.stored_org as "storedOrg", f.stored_hash as "storedHash",
       f.row_count as "rowCount", f.vine_count as "rowLength"
     from facts f
     order by f.ord`,
    [JSON.stringify(records.map((r, ord) => ({ ord, ...r }))), organisationId, organisationId, recordedBy],
  );
  return rows;
}

export function getStoredRowWorkHashes(db: Db, ids: string[]) {
  if (ids.length === 0) return Promise.resolve([]);
  return db('row_work').whereIn('id', ids).select<{ id: string; organisation_id: string; payload_sha256: string }[]>('id', 'organisation_id', 'payload_sha256');
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
    rows: {
      block_id: string;
      pass: RowWorkPass;
      row_number: number;
      recorded_by: string | null;
      by_lead: boolean;
      name: string | null;
      hours: number;
      whole: boolean;
      vines: number;
    }[];
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
