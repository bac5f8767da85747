import 'server-only';
import { csvCell } from '@/lib/reports/csv';
import { seasonBounds, seasonOf } from '@/lib/reports/season';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import {
  countCoverage,
  getPayBasis,
  getStoredRowWorkHashes,
  ingestRowWork,
  listDoneRows,
  listProgressBlocks,
  listRowWorkForExport,
  listWorkDays,
} from '@/lib/server/queries/row-work';
import { hashPayload, racedIds, rejected, settleOnce, validateRecords, type StoredHash, type SyncResult, type ValidRecord } from '@/lib/server/services/sync';
import { rowWorkRecordSchema, type RowWorkRecord } from '@/lib/validation/row-work';
import { buildBlockProgress, toContract, type BlockProgress, type PassProgress } from '@/lib/work/progress';
import type { PayBasis } from '@/lib/work/cost';
import { recordedLabour } from '@/lib/work/recorded';
import { isUuid } from '@/lib/grid/filters';

export const rowWorkHash = (r: RowWorkRecord) =>
  hashPayload({
    blockId: r.blockId,
    row: r.row,
    pass: r.pass,
    fromPosition: r.fromPosition ?? null,
    toPosition: r.toPosition ?? null,
    crewSize: r.crewSize,
    personHours: r.personHours,
    startedAt: r.startedAt ? new Date(r.startedAt).toISOString() : null,
    finishedAt: new Date(r.finishedAt).toISOString(),
    note: r.note,
  });

/**
 * Stores each row-work record once by its device-made id, with the contract of POST /api/sync:
 * created, duplicate, conflict or rejected per record, in order. The whole batch takes a fixed
 * number of statements (look-ups, one insert), however many records it holds.
 */
export async function syncRowWork(member: Member, records: unknown[]): Promise<SyncResult[]> {
  const results: SyncResult[] = new Array(records.length);
  const valid = validateRecords(records, rowWorkRecordSchema, rowWorkHash, results);
  const outcomes = await ingestRowWork(
    db(),
    member.organisationId,
    member.userId,
    valid.map(({ record: r, hash }) => ({
      id: r.id,
      block_id: r.blockId,
      row_number: r.row,
      pass: r.pass,
      from_position: r.fromPosition ?? null,
      to_position: r.toPosition ?? null,
      crew_size: r.crewSize,
      person_hours: r.personHours,
      started_at: r.startedAt ?? null,
      finished_at: r.finishedAt,
      note: r.note,
      payload_sha256: hash,
    })),
  );

  const pending: ValidRecord<RowWorkRecord>[] = [];
  const created = new Set<string>();
  const stored: StoredHash[] = [];
  for (const [i, v] of valid.entries()) {
    const r = v.record;
    const o = outcomes[i]!;
    // A retry of a stored id is answered from what is stored, whatever happened to the block since.
    if (o.storedOrg) {
      stored.push({ id: r.id, organisation_id: o.storedOrg, payload_sha256: o.storedHash! });
      pending.push(v);
      continue;
    }
    if (o.rowCount === null) {
      // Another organisation's block reads exactly like one that does not exist.
      results[v.index] = rejected(r.id, [{ field: 'blockId', message: 'No such block in your organisation' }]);
      continue;
    }
    const length = o.rowLength;
    if (length === null) {
      results[v.index] = rejected(r.id, [{ field: 'row', message: `This block has no row ${r.row} (it has ${o.rowCount} rows)` }]);
      continue;
    }
    const errors = [
      ...(r.fromPosition !== undefined && r.fromPosition > length ? [{ field: 'fromPosition', message: `Row ${r.row} has ${length} vine positions` }] : []),
      ...(r.toPosition !== undefined && r.toPosition > length ? [{ field: 'toPosition', message: `Row ${r.row} has ${length} vine positions` }] : []),
    ];
    if (errors.length) {
      results[v.index] = rejected(r.id, errors);
      continue;
    }
    if (o.inserted) created.add(r.id);
    pending.push(v);
  }
  stored.push(...(await getStoredRowWorkHashes(db(), racedIds(pending, created, stored))));
  settleOnce(pending, created, stored, member.organisationId, results);
  return results;
}

export async function loadPayBasis(organisationId: string): Promise<PayBasis> {
  const { seasonStartMonth: _s, ...pay } = await getPayBasis(db(), organisationId);
  return pay;
}

export interface EstateProgress {
  season: number;
  seasonStartMonth: number;
  pay: PayBasis;
  blocks: BlockProgress[];
}

async function progressOf(organisationId: string, season: number, blockIds?: string[]): Promise<EstateProgress> {
  const database = db();
  const [{ seasonStartMonth, ...pay }, blocks] = await Promise.all([
    getPayBasis(database, organisationId),
    listProgressBlocks(database, organisationId, blockIds),
  ]);
  const period = seasonBounds(season, seasonStartMonth);
  const ids = blocks.map((b) => b.id);
  const [coverage, days] = ids.length
    ? await Promise.all([countCoverage(database, organisationId, ids, period), listWorkDays(database, organisationId, ids, period)])
    : [{ rows: new Map(), leads: new Map() }, new Map()];
  return {
    season,
    seasonStartMonth,
    pay,
    blocks: blocks.map((block) =>
      buildBlockProgress({
        block,
        rows: coverage.rows.get(block.id) ?? [],
        leads: coverage.leads.get(block.id) ?? [],
        workDays: days.get(block.id) ?? {},
        pay,
      }),
    ),
  };
}

/** Every active block's progress in a season, in one pass over the row work. For the Desk and the estate table. */
export function loadEstateProgress(organisationId: string, season: number): Promise<EstateProgress> {
  return progressOf(organisationId, season);
}

export const currentSeason = (member: Pick<Member, 'seasonStartMonth'>, now = new Date()) => seasonOf(now, member.seasonStartMonth);

export async function loadBlockProgress(member: Member, blockId: string, season = currentSeason(member)) {
  // The /work/[blockId] page passes its path segment as it came; the API routes parse theirs.
  if (!isUuid(blockId)) throw new AppError('not-found', 'There is no such block in your organisation.');
  const progress = await progressOf(member.organisationId, season, [blockId]);
  const block = progress.blocks[0];
  if (!block) throw new AppError('not-found', 'There is no such block in your organisation.');
  return { ...progress, block };
}

/** The season's recorded row work of one block, for the season report's labour section. */
export async function loadRecordedLabour(organisationId: string, blockId: string, season: number) {
  const progress = await progressOf(organisationId, season, [blockId]);
  return progress.blocks[0] ? recordedLabour(progress.blocks[0]) : null;
}

/** GET /api/blocks/{id}/progress, exactly the fields of the contract. */
export async function blockProgressContract(member: Member, blockId: string, season?: number): Promise<{ season: number; passes: PassProgress[] }> {
  const progress = await loadBlockProgress(member, blockId, season);
  return { season: progress.season, passes: progress.block.passes.map(toContract) };
}

/** What the phone needs to show rows already done this season, per pass. */
export async function loadDoneRows(member: Member, blockId: string, now = new Date()) {
  const [block] = await listProgressBlocks(db(), member.organisationId, [blockId]);
  if (!block) throw new AppError('not-found', 'There is no such block in your organisation.');
  const season = currentSeason(member, now);
  return {
    season,
    done: await listDoneRows(db(), member.organisationId, blockId, seasonBounds(season, member.seasonStartMonth)),
    fetchedAt: now.toISOString(),
  };
}

export const ROW_WORK_CSV_COLUMNS = [
  'id',
  'season',
  'block',
  'row',
  'pass',
  'from_position',
  'to_position',
  'crew_size',
  'person_hours',
  'started_at',
  'finished_at',
  'recorded_by',
  'note',
] as const;

/** The season's row work as CSV lines, header first. */
export async function rowWorkCsv(member: Member, season: number, blockId?: string): Promise<string> {
  const rows = await listRowWorkForExport(db(), member.organisationId, seasonBounds(season, member.seasonStartMonth), blockId);
  const lines = rows.map((r) =>
    [
      r.id,
      season,
      r.block,
      r.row_number,
      r.pass,
      r.from_position,
      r.to_position,
      r.crew_size,
      Number(r.person_hours),
      r.started_at?.toISOString() ?? null,
      r.finished_at.toISOString(),
      r.recorded_by,
      r.note,
    ]
      .map(csvCell)
      .join(','),
  );
  return [ROW_WORK_CSV_COLUMNS.join(','), ...lines].join('\r\n') + '\r\n';
}
