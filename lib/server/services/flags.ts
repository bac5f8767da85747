import 'server-only';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { getFlag, getStoredFlagHashes, insertFlagsOnce, setFlagStatus, type FlagInsert } from '@/lib/server/queries/flags';
import { ownedBlockIds, resolveSlots, slotKey } from '@/lib/server/queries/observations';
import { hashPayload, rejected, settleOnce, validateRecords, type SyncResult, type ValidRecord } from '@/lib/server/services/sync';
import { flagRecordSchema, type FlagRecord } from '@/lib/validation/flag';

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
  const known = await getStoredFlagHashes(db(), valid.map((v) => v.record.id));
  const knownIds = new Set(known.map((k) => k.id));
  const fresh = valid.filter((v) => !knownIds.has(v.record.id));

  const blocks = await ownedBlockIds(db(), member.organisationId, [...new Set(fresh.map((v) => v.record.blockId))]);
  const inBlocks = fresh.filter((v) => blocks.has(v.record.blockId));
  const slots = await resolveSlots(db(), member.organisationId, [
    ...inBlocks.map((v) => ({ blockId: v.record.blockId, row: v.record.row, position: v.record.position })),
    ...inBlocks.map((v) => ({ blockId: v.record.blockId, row: v.record.row, position: v.record.toPosition ?? v.record.position })),
  ]);

  const rows: FlagInsert[] = [];
  const pending: ValidRecord<FlagRecord>[] = valid.filter((v) => knownIds.has(v.record.id));
  for (const v of fresh) {
    const r = v.record;
    const last = r.toPosition ?? r.position;
    if (!blocks.has(r.blockId)) {
      results[v.index] = rejected(r.id, [{ field: 'blockId', message: 'No such block in your organisation' }]);
      continue;
    }
    const positionId = slots.get(slotKey({ blockId: r.blockId, row: r.row, position: r.position }));
    if (!positionId) {
      results[v.index] = rejected(r.id, [{ field: 'position', message: `Row ${r.row} has no vine position ${r.position} in this block` }]);
      continue;
    }
    if (!slots.has(slotKey({ blockId: r.blockId, row: r.row, position: last }))) {
      results[v.index] = rejected(r.id, [{ field: 'toPosition', message: `Row ${r.row} has no vine position ${last} in this block` }]);
      continue;
    }
    rows.push({
      id: r.id,
      organisation_id: member.organisationId,
      block_id: r.blockId,
      position_id: positionId,
      row_number: r.row,
      position: r.position,
      to_position: last,
      reason: r.reason,
      note: r.note,
      flagged_at: r.flaggedAt,
      flagged_by: member.userId,
      payload_sha256: v.hash,
    });
    pending.push(v);
  }

  const created = await insertFlagsOnce(db(), rows);
  // Ids another request stored between our look-up and our insert.
  const raced = await getStoredFlagHashes(db(), rows.filter((r) => !created.has(r.id)).map((r) => r.id));
  settleOnce(pending, created, [...known, ...raced], member.organisationId, results);
  return results;
}

export async function closeOrReopenFlag(member: Member, id: string, status: 'open' | 'closed') {
  const flag = await getFlag(db(), member.organisationId, id);
  if (!flag) throw new AppError('not-found', 'No such flag in your organisation.');
  if (flag.taskId && flag.taskStatus === 'open') {
    throw new AppError('conflict', `This flag is being worked in the task “${flag.taskTitle}”; it closes with that task.`);
  }
  await setFlagStatus(db(), member.organisationId, id, status, member.userId);
  return getFlag(db(), member.organisationId, id);
}
