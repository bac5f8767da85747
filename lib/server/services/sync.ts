import 'server-only';
import { createHash } from 'node:crypto';
import type { ZodType } from 'zod';
import { isUuid } from '@/lib/grid/filters';
import { can } from '@/lib/roles';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { fieldErrors } from '@/lib/server/http';
import { getStoredHashes, ingestObservations } from '@/lib/server/queries/observations';
import { observationRecordSchema, type ObservationRecord } from '@/lib/validation/observation';
import { settingsForBlocks } from '@/lib/server/services/settings';
import { observationSeverity, type ObservationKind } from '@/lib/viticulture';
import type { SyncResult, SyncStatus } from '@/lib/contracts/sync';

export type { SyncResult, SyncStatus };

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

/** The hash that tells a retry from a conflict; give times as ISO strings in UTC. */
export function hashPayload(payload: Record<string, unknown>) {
  return createHash('sha256')
    .update(JSON.stringify(canonical(payload)))
    .digest('hex');
}

export function payloadHash(r: ObservationRecord) {
  return hashPayload({
    blockId: r.blockId,
    row: r.row,
    position: r.position,
    kind: r.kind,
    data: r.data,
    note: r.note,
    observedAt: new Date(r.observedAt).toISOString(),
  });
}

export const rejected = (id: string, errors: { field: string; message: string }[]): SyncResult => ({ id, status: 'rejected', errors });

export interface ValidRecord<R> {
  index: number;
  record: R;
  hash: string;
}

/** Parses each raw record on its own: the invalid ones get their "rejected" result, the valid ones come back hashed. */
export function validateRecords<R extends { id: string }>(
  records: unknown[],
  schema: ZodType<R>,
  hash: (record: R) => string,
  results: SyncResult[],
): ValidRecord<R>[] {
  const valid: ValidRecord<R>[] = [];
  records.forEach((raw, index) => {
    const parsed = schema.safeParse(raw);
    const id = typeof (raw as { id?: unknown })?.id === 'string' ? (raw as { id: string }).id : '';
    if (!parsed.success) {
      results[index] = rejected(
        id,
        Object.entries(fieldErrors(parsed.error)).flatMap(([field, messages]) => messages.map((message) => ({ field, message }))),
      );
    } else {
      valid.push({ index, record: parsed.data, hash: hash(parsed.data) });
    }
  });
  return valid;
}

export interface StoredHash {
  id: string;
  organisation_id: string;
  payload_sha256: string;
}

/**
 * Ids that were neither inserted nor found stored: another request stored them between this
 * statement's snapshot and its insert. Rare; the caller looks them up once more.
 */
export function racedIds<R extends { id: string }>(pending: ValidRecord<R>[], created: Set<string>, stored: StoredHash[]) {
  const known = new Set(stored.map((s) => s.id));
  return [...new Set(pending.map((v) => v.record.id).filter((id) => !created.has(id) && !known.has(id)))];
}

/**
 * After an insert-once: "created" for the first record of each new id in the batch, otherwise
 * "duplicate" or "conflict" against what is stored. Another organisation's id reads as a conflict.
 */
export function settleOnce<R extends { id: string }>(
  pending: ValidRecord<R>[],
  created: Set<string>,
  stored: StoredHash[],
  organisationId: string,
  results: SyncResult[],
) {
  const seen = new Map<string, string>();
  const existing = new Map(stored.map((r) => [r.id, r]));
  for (const v of pending) {
    const id = v.record.id;
    // The first record with an id in this batch is the one stored; later ones compare with it.
    if (created.has(id) && !seen.has(id)) {
      seen.set(id, v.hash);
      results[v.index] = { id, status: 'created' };
      continue;
    }
    const hash = seen.get(id) ?? (existing.get(id)?.organisation_id === organisationId ? existing.get(id)?.payload_sha256 : undefined);
    results[v.index] = { id, status: hash === v.hash ? 'duplicate' : 'conflict' };
  }
}

/**
 * Stores each observation once, by its device-made id: a retry of the same record answers
 * "duplicate", the same id with another payload answers "conflict" and keeps what is stored.
 * Invalid records are rejected one by one; the valid ones of the batch are still stored. The
 * database sees one statement per batch (ingestObservations), however many records it holds.
 */
export async function syncObservations(member: Member, records: unknown[]): Promise<SyncResult[]> {
  const results: SyncResult[] = new Array(records.length);
  // Severity is judged with each block's own settings, as the phone judged it. Asked for before the
  // records are validated, so that the database answers while the CPU validates.
  const blockIds = new Set(records.map((r) => (r as { blockId?: unknown } | null)?.blockId).filter(isUuid));
  const settings = settingsForBlocks(db(), member.organisationId, [...blockIds]);
  const valid = validateRecords(records, observationRecordSchema, payloadHash, results);
  const settingsOf = await settings;
  const outcomes = await ingestObservations(
    db(),
    member.organisationId,
    member.userId,
    can(member.role, 'check-pruning'),
    valid.map(({ record: r, hash }) => ({
      id: r.id,
      block_id: r.blockId,
      row_number: r.row,
      position: r.position,
      kind: r.kind,
      data: r.data,
      note: r.note,
      observed_at: r.observedAt,
      severity: observationSeverity(r.kind as ObservationKind, r.data as never, settingsOf(r.blockId)),
      payload_sha256: hash,
    })),
  );

  const pending: typeof valid = [];
  const created = new Set<string>();
  const stored: StoredHash[] = [];
  for (const [i, v] of valid.entries()) {
    const r = v.record;
    const o = outcomes[i]!;
    if (!o.blockOk) {
      // Another organisation's block reads exactly like one that does not exist.
      results[v.index] = rejected(r.id, [{ field: 'blockId', message: 'No such block in your organisation' }]);
    } else if (!o.positionOk) {
      results[v.index] = rejected(r.id, [{ field: 'position', message: `Row ${r.row} has no vine position ${r.position} in this block` }]);
    } else if (r.kind === 'pruning-check' && !can(member.role, 'check-pruning')) {
      results[v.index] = rejected(r.id, [{ field: 'kind', message: 'Only a crew lead (pruner) or a manager records pruning checks' }]);
    } else if (!o.crewOk) {
      results[v.index] = rejected(r.id, [{ field: 'data.prunedBy', message: 'No such person in your organisation' }]);
    } else {
      pending.push(v);
      if (o.inserted) created.add(r.id);
      if (o.storedOrg) stored.push({ id: r.id, organisation_id: o.storedOrg, payload_sha256: o.storedHash! });
    }
  }
  stored.push(...(await getStoredHashes(db(), racedIds(pending, created, stored))));
  settleOnce(pending, created, stored, member.organisationId, results);
  return results;
}
