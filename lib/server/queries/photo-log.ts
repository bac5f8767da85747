import 'server-only';
import { dayAfter } from '@/lib/grid/filters';
import type { PhotoCursor, PhotoFilters } from '@/lib/grid/photo-filters';
import type { Db } from '@/lib/server/db';

export interface PhotoLogRow {
  id: string;
  width: number | null;
  height: number | null;
  /** When the photo was taken (upload time when unknown), as an ISO string with microseconds for the cursor. */
  takenAt: string;
  observationId: string;
  kind: string;
  data: Record<string, unknown>;
  note: string;
  severity: number;
  status: 'open' | 'closed';
  observedAt: Date;
  blockId: string;
  blockName: string;
  row: number;
  position: number;
  positionId: string;
  recordedBy: string | null;
  recordedByName: string | null;
}

const TAKEN = 'coalesce(p.taken_at, p.created_at)';

/** One page of the organisation's stored photos, newest first, after `cursor`. Fetches one extra row to tell if more follow. */
export function listPhotoLog(db: Db, organisationId: string, f: PhotoFilters, cursor: PhotoCursor | null, limit: number): Promise<PhotoLogRow[]> {
  const q = db('photos as p')
    .join('observations as o', 'o.id', 'p.observation_id')
    .join('blocks as b', 'b.id', 'o.block_id')
    .leftJoin('users as u', 'u.id', 'o.recorded_by')
    .where({ 'p.organisation_id': organisationId, 'p.status': 'stored', 'o.organisation_id': organisationId })
    .whereNull('o.deleted_at');
  if (f.block) q.andWhere('o.block_id', f.block);
  if (f.row !== undefined) q.andWhere('o.row_number', f.row);
  if (f.kind.length) q.whereIn('o.kind', f.kind);
  if (f.severity !== undefined) q.andWhere('o.severity', '>=', f.severity);
  if (f.by) q.andWhere('o.recorded_by', f.by);
  if (f.from) q.andWhereRaw(`${TAKEN} >= ?`, [`${f.from}T00:00:00Z`]);
  if (f.to) q.andWhereRaw(`${TAKEN} < ?`, [dayAfter(f.to)]);
  if (cursor) q.andWhereRaw(`(${TAKEN}, p.id) < (?::timestamptz, ?::uuid)`, [cursor.at, cursor.id]);
  return q
    .orderByRaw(`${TAKEN} desc, p.id desc`)
    .limit(limit + 1)
    .select({
      id: 'p.id',
      width: 'p.width',
      height: 'p.height',
      takenAt: db.raw(`to_char(${TAKEN} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`),
      observationId: 'o.id',
      kind: 'o.kind',
      data: 'o.data',
      note: 'o.note',
      severity: 'o.severity',
      status: 'o.status',
      observedAt: 'o.observed_at',
      blockId: 'b.id',
      blockName: 'b.name',
      row: 'o.row_number',
      position: 'o.position',
      positionId: 'o.position_id',
      recordedBy: 'o.recorded_by',
      recordedByName: db.raw('coalesce(u.name, u.email)'),
    });
}

/** A stored photo of this organisation, or undefined: never another organisation's, never one still pending. */
export function getStoredPhoto(db: Db, organisationId: string, photoId: string) {
  return db('photos')
    .where({ id: photoId, organisation_id: organisationId, status: 'stored' })
    .first<{ objectKey: string; thumbKey: string | null } | undefined>({ objectKey: 'object_key', thumbKey: 'thumb_key' });
}
