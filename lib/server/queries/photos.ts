import 'server-only';
import type { Db } from '@/lib/server/db';

export interface PhotoRow {
  id: string;
  organisation_id: string;
  observation_id: string;
  uploaded_by: string | null;
  status: 'pending' | 'stored';
  object_key: string;
  thumb_key: string | null;
  content_type: string | null;
  bytes: string | null;
  width: number | null;
  height: number | null;
  sha256: string | null;
  latitude: number | null;
  longitude: number | null;
  taken_at: Date | null;
  created_at: Date;
  stored_at: Date | null;
}

/** Inserts the pending row once; answers the row as stored now (new or earlier). */
export async function insertPendingPhoto(
  db: Db,
  photo: { id: string; organisationId: string; observationId: string; uploadedBy: string; objectKey: string; takenAt: string | null },
): Promise<PhotoRow> {
  await db('photos')
    .insert({
      id: photo.id,
      organisation_id: photo.organisationId,
      observation_id: photo.observationId,
      uploaded_by: photo.uploadedBy,
      object_key: photo.objectKey,
      taken_at: photo.takenAt,
    })
    .onConflict('id')
    .ignore();
  return (await db<PhotoRow>('photos').where({ id: photo.id }).first())!;
}

export function getPhotoForUpdate(db: Db, id: string) {
  return db<PhotoRow>('photos').where({ id }).forUpdate().first();
}

export async function markPhotoStored(
  db: Db,
  id: string,
  facts: { thumbKey: string; bytes: number; width: number; height: number; sha256: string; latitude: number | null; longitude: number | null },
) {
  await db('photos').where({ id }).update({
    status: 'stored',
    thumb_key: facts.thumbKey,
    content_type: 'image/jpeg',
    bytes: facts.bytes,
    width: facts.width,
    height: facts.height,
    sha256: facts.sha256,
    latitude: facts.latitude,
    longitude: facts.longitude,
    stored_at: db.fn.now(),
  });
}

export async function deletePhoto(db: Db, id: string) {
  await db('photos').where({ id }).delete();
}

/** Pending uploads nobody confirmed: claimed with SKIP LOCKED so that several servers can sweep at once. */
export function claimStalePendingPhotos(db: Db, olderThan: Date, limit = 100) {
  return db<PhotoRow>('photos')
    .where('status', 'pending')
    .where('created_at', '<', olderThan)
    .orderBy('created_at')
    .limit(limit)
    .forUpdate()
    .skipLocked()
    .select('id', 'object_key');
}
