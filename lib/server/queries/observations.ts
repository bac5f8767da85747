import 'server-only';
import type { Db } from '@/lib/server/db';

export interface ObservationInsert {
  id: string;
  organisation_id: string;
  block_id: string;
  position_id: string;
  row_number: number;
  position: number;
  kind: string;
  data: unknown;
  note: string;
  observed_at: string;
  recorded_by: string;
  severity: number;
  payload_sha256: string;
}

/** Inserts once by id; answers the ids that were new. Existing ids are left untouched. */
export async function insertObservationsOnce(db: Db, rows: ObservationInsert[]): Promise<Set<string>> {
  if (rows.length === 0) return new Set();
  const inserted = await db('observations')
    .insert(rows.map((r) => ({ ...r, data: JSON.stringify(r.data) })))
    .onConflict('id')
    .ignore()
    .returning('id');
  return new Set(inserted.map((r: { id: string }) => r.id));
}

export async function getStoredHashes(db: Db, ids: string[]) {
  if (ids.length === 0) return [];
  return db('observations')
    .whereIn('id', ids)
    .select<{ id: string; organisation_id: string; payload_sha256: string }[]>('id', 'organisation_id', 'payload_sha256');
}

export interface SlotKey {
  blockId: string;
  row: number;
  position: number;
}

/** Resolves many block/row/position addresses to slot ids in one query. */
export async function resolveSlots(db: Db, organisationId: string, keys: SlotKey[]) {
  if (keys.length === 0) return new Map<string, string>();
  const rows = await db.raw<{ rows: { id: string; block_id: string; row_number: number; position: number }[] }>(
    `select p.id, p.block_id, p.row_number, p.position
       from unnest(?::uuid[], ?::int[], ?::int[]) as k(block_id, row_number, position)
       join vine_positions p on p.block_id = k.block_id and p.row_number = k.row_number and p.position = k.position
       join blocks b on b.id = p.block_id and b.organisation_id = ?`,
    [keys.map((k) => k.blockId), keys.map((k) => k.row), keys.map((k) => k.position), organisationId],
  );
  return new Map(rows.rows.map((r) => [slotKey({ blockId: r.block_id, row: r.row_number, position: r.position }), r.id]));
}

export const slotKey = (k: SlotKey) => `${k.blockId}:${k.row}:${k.position}`;

/** The blocks of this organisation among the given ids. */
export async function ownedBlockIds(db: Db, organisationId: string, blockIds: string[]) {
  if (blockIds.length === 0) return new Set<string>();
  const ids = await db('blocks').where({ organisation_id: organisationId }).whereIn('id', blockIds).pluck('id');
  return new Set<string>(ids);
}

export function getObservation(db: Db, organisationId: string, id: string) {
  return db('observations').where({ id, organisation_id: organisationId }).whereNull('deleted_at').first();
}
