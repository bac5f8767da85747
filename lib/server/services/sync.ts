import 'server-only';
import { createHash } from 'node:crypto';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { fieldErrors } from '@/lib/server/http';
import {
  getStoredHashes,
  insertObservationsOnce,
  ownedBlockIds,
  resolveSlots,
  slotKey,
  type ObservationInsert,
} from '@/lib/server/queries/observations';
import { observationRecordSchema, type ObservationRecord } from '@/lib/validation/observation';
import { observationSeverity, type ObservationKind } from '@/lib/viticulture';

export type SyncStatus = 'created' | 'duplicate' | 'conflict' | 'rejected';

export interface SyncResult {
  id: string;
  status: SyncStatus;
  errors?: { field: string; message: string }[];
}

/** Key order and time format must not make a retry look like a different record. */
function canonical(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(canonical);
  if (value && typeof value === 'object') {
    return Object.fromEntries(
      Object.keys(value)
        .sort()
        .map((k) => [k, canonical((value as Record<string, unknown>)[k])]),
    );
  }
  return value;
}

export function payloadHash(r: ObservationRecord) {
  const payload = {
    blockId: r.blockId,
    row: r.row,
    position: r.position,
    kind: r.kind,
    data: r.data,
    note: r.note,
    observedAt: new Date(r.observedAt).toISOString(),
  };
  return createHash('sha256').update(JSON.stringify(canonical(payload))).digest('hex');
}

const rejected = (id: string, errors: { field: string; message: string }[]): SyncResult => ({ id, status: 'rejected', errors });

/**
 * Stores each observation once, by its device-made id: a retry of the same record answers
 * "duplicate", the same id with another payload answers "conflict" and keeps what is stored.
 * Invalid records are rejected one by one; the valid ones of the batch are still stored.
 */
export async function syncObservations(member: Member, records: unknown[]): Promise<SyncResult[]> {
  const results: SyncResult[] = new Array(records.length);
  const valid: { index: number; record: ObservationRecord; hash: string }[] = [];

  records.forEach((raw, index) => {
    const parsed = observationRecordSchema.safeParse(raw);
    const id = typeof (raw as { id?: unknown })?.id === 'string' ? (raw as { id: string }).id : '';
    if (!parsed.success) {
      results[index] = rejected(
        id,
        Object.entries(fieldErrors(parsed.error)).flatMap(([field, messages]) => messages.map((message) => ({ field, message }))),
      );
    } else {
      valid.push({ index, record: parsed.data, hash: payloadHash(parsed.data) });
    }
  });

  const blocks = await ownedBlockIds(db(), member.organisationId, [...new Set(valid.map((v) => v.record.blockId))]);
  const slots = await resolveSlots(
    db(),
    member.organisationId,
    valid.filter((v) => blocks.has(v.record.blockId)).map((v) => ({ blockId: v.record.blockId, row: v.record.row, position: v.record.position })),
  );

  const rows: ObservationInsert[] = [];
  const pending: typeof valid = [];
  for (const v of valid) {
    const r = v.record;
    if (!blocks.has(r.blockId)) {
      // Another organisation's block reads exactly like one that does not exist.
      results[v.index] = rejected(r.id, [{ field: 'blockId', message: 'No such block in your organisation' }]);
      continue;
    }
    const positionId = slots.get(slotKey({ blockId: r.blockId, row: r.row, position: r.position }));
    if (!positionId) {
      results[v.index] = rejected(r.id, [{ field: 'position', message: `Row ${r.row} has no vine position ${r.position} in this block` }]);
      continue;
    }
    rows.push({
      id: r.id,
      organisation_id: member.organisationId,
      block_id: r.blockId,
      position_id: positionId,
      row_number: r.row,
      position: r.position,
      kind: r.kind,
      data: r.data,
      note: r.note,
      observed_at: r.observedAt,
      recorded_by: member.userId,
      severity: observationSeverity(r.kind as ObservationKind, r.data as never),
      payload_sha256: v.hash,
    });
    pending.push(v);
  }

  const created = await insertObservationsOnce(db(), rows);
  const seen = new Map<string, string>();
  const existing = new Map(
    (await getStoredHashes(db(), pending.filter((v) => !created.has(v.record.id)).map((v) => v.record.id))).map((r) => [r.id, r]),
  );
  for (const v of pending) {
    const id = v.record.id;
    // The first record with an id in this batch is the one stored; later ones compare with it.
    if (created.has(id) && !seen.has(id)) {
      seen.set(id, v.hash);
      results[v.index] = { id, status: 'created' };
      continue;
    }
    const stored = seen.get(id) ?? (existing.get(id)?.organisation_id === member.organisationId ? existing.get(id)?.payload_sha256 : undefined);
    results[v.index] = { id, status: stored === v.hash ? 'duplicate' : 'conflict' };
  }
  return results;
}
