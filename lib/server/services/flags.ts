import 'server-only';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { getFlag, getStoredFlagHashes, ingestFlags, listFlags, setFlagStatus } from '@/lib/server/queries/flags';
import { hashPayload, racedIds, rejected, settleOnce, validateRecords, type StoredHash, type SyncResult, type ValidRecord } from '@/lib/server/services/sync';
import { flagRecordSchema, type FlagListQuery, type FlagRecord } from '@/lib/validation/flag';

const flagHash = (r: FlagRecord) =>
  hashPayload({
    blockId: r.blockId,
    row: r.row,
    position: r.position,
    toPosition: r.toPosition ?? r.position,
    reason: r.reason,
    note: r.note,
    flaggedAt: new Date(r.flaggedAt).toISOString(),
  });

/**
 * Stores each flag once by its device-made id, with the contract of POST /api/sync: created,
 * duplicate, conflict or rejected per record, in order. A retry of a stored id is answered from
 * what is stored, whatever happened to the vine since.
 */
export async function syncFlags(member: Member, records: unknown[]): Promise<SyncResult[]> {
  const results: SyncResult[] = new Array(records.length);
  const valid = validateRecords(records, flagRecordSchema, flagHash, results);
  const outcomes = await ingestFlags(
    db(),
    member.organisationId,
    member.userId,
    valid.map(({ record: r, hash }) => ({
      id: r.id,
      block_id: r.blockId,
      row_number: r.row,
      position: r.position,
      to_position: r.toPosition ?? r.position,
      reason: r.reason,
      note: r.note,
      flagged_at: r.flaggedAt,
      payload_sha256: hash,
    })),
  );

  const pending: ValidRecord<FlagRecord>[] = [];
  const created = new Set<string>();
  const stored: StoredHash[] = [];
  for (const [i, v] of valid.entries()) {
    const r = v.record;
    const o = outcomes[i]!;
    if (o.storedOrg) {
      stored.push({ id: r.id, organisation_id: o.storedOrg, payload_sha256: o.storedHash! });
      pending.push(v);
    } else if (!o.blockOk) {
      results[v.index] = rejected(r.id, [{ field: 'blockId', message: 'No such block in your organisation' }]);
    } else if (!o.positionId) {
      results[v.index] = rejected(r.id, [{ field: 'position', message: `Row ${r.row} has no vine position ${r.position} in this block` }]);
    } else if (!o.toOk) {
      results[v.index] = rejected(r.id, [{ field: 'toPosition', message: `Row ${r.row} has no vine position ${r.toPosition ?? r.position} in this block` }]);
    } else {
      if (o.inserted) created.add(r.id);
      pending.push(v);
    }
  }
  // Ids another request stored between this statement's snapshot and its insert.
  stored.push(...(await getStoredFlagHashes(db(), racedIds(pending, created, stored))));
  settleOnce(pending, created, stored, member.organisationId, results);
  return results;
}

const noSuchFlag = () => new AppError('not-found', 'No such flag in your organisation.');

export const listFlagViews = (member: Member, query: FlagListQuery) => listFlags(db(), member.organisationId, query);

export async function getFlagView(member: Member, id: string) {
  const flag = await getFlag(db(), member.organisationId, id);
  if (!flag) throw noSuchFlag();
  return flag;
}

export async function closeOrReopenFlag(member: Member, id: string, status: 'open' | 'closed') {
  const flag = await getFlagView(member, id);
  if (flag.taskId && flag.taskStatus === 'open') {
    throw new AppError('conflict', `This flag is being worked in the task “${flag.taskTitle}”; it closes with that task.`);
  }
  await setFlagStatus(db(), member.organisationId, id, status, member.userId);
  return getFlagView(member, id);
}
