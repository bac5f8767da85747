import 'server-only';
import type { Db } from '@/lib/server/db';

export interface PhotoRow {
  id: string;
  organisation_id: string;
  observation_id: string;
  uploaded_by: string | null;
  status: 'pending' | 'stored';
  object_key: string;
  upload_key: string | null;
  upload_type: string | null;
  upload_bytes: string | null;
  confirm_claim: string | null;
  confirm_until: Date | null;
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
  photo: {
    id: string;
    organisationId: string;
    observationId: string;
    uploadedBy: string;
    objectKey: string;
    uploadKey: string;
    takenAt: string | null;
  },
): Promise<PhotoRow> {
  await db('photos')
    .insert({
      id: photo.id,
      organisation_id: photo.organisationId,
      observation_id: photo.observationId,
      uploaded_by: photo.uploadedBy,
      object_key: photo.objectKey,
      upload_key: photo.uploadKey,
      taken_at: photo.takenAt,
    })
    .onConflict('id')
    .ignore();
  return (await db<PhotoRow>('photos').where({ id: photo.id }).first())!;
}

/**
 * Records what the next upload link is bound to, and answers the key it writes to. A row from
 * before upload keys (its upload key is its served key) gets a fresh upload key here.
 */
export async function prepareUpload(db: Db, id: string, declared: { contentType: string; bytes: number; freshKey: string }) {
  const [row] = await db('photos')
    .where({ id, status: 'pending' })
    .update({
      upload_type: declared.contentType,
      upload_bytes: declared.bytes,
      upload_key: db.raw('coalesce(nullif(upload_key, object_key), ?)', [declared.freshKey]),
    })
    .returning('upload_key');
  return (row as { upload_key: string } | undefined)?.upload_key;
}

export function getPhoto(db: Db, id: string) {
  return db<PhotoRow>('photos').where({ id }).first();
}

/**
 * Claims a pending photo of the organisation for one confirm, for a lease: one short statement,
 * no lock held afterwards. Answers the row when claimed, undefined when it is stored, claimed by
 * another confirm whose lease still runs, or not there.
 */
export async function claimPhotoForConfirm(db: Db, organisationId: string, id: string, claim: string, leaseSeconds: number) {
  const [row] = await db<PhotoRow>('photos')
    .where({ id, organisation_id: organisationId, status: 'pending' })
    .where((q) => q.whereNull('confirm_until').orWhere('confirm_until', '<', db.fn.now()))
    .update({ confirm_claim: claim, confirm_until: db.raw(`now() + make_interval(secs => ?)`, [leaseSeconds]) })
    .returning('*');
  return row as PhotoRow | undefined;
}

/** Gives a claim back, so that the next confirm need not wait for the lease (after a 503 or 409). */
export async function releasePhotoClaim(db: Db, id: string, claim: string) {
  await db('photos').where({ id, confirm_claim: claim }).update({ confirm_claim: null, confirm_until: null });
}

/** Deletes a refused pending photo, only while this confirm still holds it. */
export async function deleteClaimedPhoto(db: Db, id: string, claim: string) {
  return db('photos').where({ id, confirm_claim: claim, status: 'pending' }).delete();
}

/** Records a confirm's result; false when the claim was lost (its lease ran out and another took it). */
export async function markPhotoStored(
  db: Db,
  id: string,
  claim: string,
  facts: { thumbKey: string; bytes: number; width: number; height: number; sha256: string; latitude: number | null; longitude: number | null },
) {
  const updated = await db('photos').where({ id, confirm_claim: claim, status: 'pending' }).update({
    confirm_claim: null,
    confirm_until: null,
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
  return updated === 1;
}

export async function deletePhoto(db: Db, id: string) {
  await db('photos').where({ id }).delete();
}

/**
 * Pending uploads nobody confirmed, claimed like a confirm does (so a late confirm and another
 * server's sweep both keep off them) in one statement; the objects are deleted afterwards,
 * outside any transaction.
 */
export async function claimStalePendingPhotos(db: Db, olderThan: Date, claim: string, leaseSeconds: number, limit = 100) {
  const ids = db('photos')
    .where('status', 'pending')
    .where('created_at', '<', olderThan)
    .where((q) => q.whereNull('confirm_until').orWhere('confirm_until', '<', db.fn.now()))
    .orderBy('created_at')
    .limit(limit)
    .forUpdate()
    .skipLocked()
    .select('id');
  return (await db('photos')
    .whereIn('id', ids)
    .update({ confirm_claim: claim, confirm_until: db.raw(`now() + make_interval(secs => ?)`, [leaseSeconds]) })
    .returning(['id', 'object_key', 'thumb_key', 'upload_key'])) as Pick<PhotoRow, 'id' | 'object_key' | 'thumb_key' | 'upload_key'>[];
}

/** Of these upload keys, the ones a pending photo still waits on. */
export async function uploadKeysInUse(db: Db, keys: string[]) {
  if (keys.length === 0) return new Set<string>();
  const rows = await db<PhotoRow>('photos').where('status', 'pending').whereIn('upload_key', keys).select('upload_key');
  return new Set(rows.map((r) => r.upload_key!));
}
