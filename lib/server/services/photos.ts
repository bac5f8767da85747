import 'server-only';
import { createHash } from 'node:crypto';
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import exifr from 'exifr';
import sharp from 'sharp';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { getObservation } from '@/lib/server/queries/observations';
import { getOrganisation } from '@/lib/server/queries/organisations';
import {
  claimStalePendingPhotos,
  deletePhoto,
  getPhotoForUpdate,
  insertPendingPhoto,
  markPhotoStored,
} from '@/lib/server/queries/photos';
import { bucket, photoKey, presignPut, s3, thumbKey } from '@/lib/server/storage';
import { PHOTO_MAX_BYTES, PHOTO_MAX_LONG_SIDE, THUMB_LONG_SIDE, THUMB_QUALITY } from '@/lib/storage-keys';
import type { z } from 'zod';
import type { presignPhotoSchema } from '@/lib/validation/photo';

const IMAGE_FORMATS = new Set(['jpeg', 'png', 'webp', 'heif']);

/**
 * Step 1 of an upload: a row marked pending, and a short-lived URL to PUT the bytes straight to
 * object storage. Calling it again for the same id is safe: a stored photo answers "stored" and
 * needs no upload; a pending one gets a fresh URL.
 */
export async function presignPhoto(member: Member, input: z.infer<typeof presignPhotoSchema>) {
  const observation = await getObservation(db(), member.organisationId, input.observationId);
  if (!observation) throw new AppError('not-found', 'No such observation in your organisation. Sync the observation first.');
  const row = await insertPendingPhoto(db(), {
    id: input.id,
    organisationId: member.organisationId,
    observationId: input.observationId,
    uploadedBy: member.userId,
    objectKey: photoKey(member.organisationId, input.id),
    takenAt: input.takenAt ?? null,
  });
  if (row.organisation_id !== member.organisationId || row.observation_id !== input.observationId) {
    throw new AppError('conflict', 'This photo id is already used by another photo.');
  }
  if (row.status === 'stored') return { id: row.id, status: 'stored' as const };
  return {
    id: row.id,
    status: 'pending' as const,
    uploadUrl: await presignPut(row.object_key, input.contentType),
    headers: { 'content-type': input.contentType },
  };
}

async function readObject(key: string) {
  try {
    const res = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    return { length: Number(res.ContentLength ?? 0), body: res.Body! };
  } catch (err) {
    if ((err as { name?: string }).name === 'NoSuchKey') return undefined;
    throw err;
  }
}

async function deleteObject(key: string) {
  await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
}

async function putJpeg(key: string, body: Buffer) {
  await s3().send(new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentType: 'image/jpeg' }));
}

async function readLocation(bytes: Buffer) {
  try {
    const gps = await exifr.gps(bytes);
    return gps ? { latitude: gps.latitude, longitude: gps.longitude } : { latitude: null, longitude: null };
  } catch {
    return { latitude: null, longitude: null };
  }
}

/**
 * Step 2: the server reads what was uploaded and only then marks it stored. The bytes must really
 * be an image (sharp decodes them; the name or type claimed means nothing). It is turned upright
 * by its EXIF orientation, re-encoded without location or camera metadata, given a thumbnail, and
 * its size, dimensions and checksum are recorded. Anything refused is deleted from storage.
 */
export async function confirmPhoto(member: Member, id: string) {
  const outcome = await db().transaction(async (trx) => {
    const row = await getPhotoForUpdate(trx, id);
    if (!row || row.organisation_id !== member.organisationId) throw new AppError('not-found', 'No such photo in your organisation.');
    if (row.status === 'stored') {
      return { id, status: 'stored' as const, bytes: Number(row.bytes), width: row.width, height: row.height, sha256: row.sha256 };
    }
    const object = await readObject(row.object_key);
    if (!object) throw new AppError('conflict', 'The photo has not been uploaded yet. Upload it, then confirm again.');

    // A refusal must commit its deletions, so it is returned rather than thrown inside the transaction.
    const refuse = async (error: AppError) => {
      await deleteObject(row.object_key);
      await deletePhoto(trx, id);
      return { refused: error };
    };
    if (object.length > PHOTO_MAX_BYTES) {
      return refuse(new AppError('payload-too-large', `The photo is larger than ${PHOTO_MAX_BYTES / 1024 / 1024} MB.`));
    }
    const original = Buffer.from(await object.body.transformToByteArray());
    const format = await sharp(original)
      .metadata()
      .then((m) => m.format)
      .catch(() => undefined);
    if (!format || !IMAGE_FORMATS.has(format)) {
      return refuse(new AppError('invalid-input', 'That file is not a photo (JPEG, PNG or WebP). It was not kept.'));
    }

    const organisation = await getOrganisation(trx, member.organisationId);
    const location = organisation?.keep_photo_location ? await readLocation(original) : { latitude: null, longitude: null };
    // sharp drops all metadata unless told to keep it: that is the stripping.
    // Both come from the original at once: the thumbnail decodes it at reduced scale, which is far
    // cheaper than decoding the re-encoded copy again.
    const [{ data: stored, info }, thumb] = await Promise.all([
      sharp(original)
        .rotate()
        .resize({ width: PHOTO_MAX_LONG_SIDE, height: PHOTO_MAX_LONG_SIDE, fit: 'inside', withoutEnlargement: true })
        .jpeg({ quality: 85 })
        .toBuffer({ resolveWithObject: true }),
      sharp(original)
        .rotate()
        .resize({ width: THUMB_LONG_SIDE, height: THUMB_LONG_SIDE, fit: 'inside', withoutEnlargement: true })
        .jpeg({ quality: THUMB_QUALITY })
        .toBuffer(),
    ]);
    const facts = {
      thumbKey: thumbKey(member.organisationId, id),
      bytes: stored.length,
      width: info.width,
      height: info.height,
      sha256: createHash('sha256').update(stored).digest('hex'),
      ...location,
    };
    await Promise.all([putJpeg(row.object_key, stored), putJpeg(facts.thumbKey, thumb)]);
    await markPhotoStored(trx, id, facts);
    return { id, status: 'stored' as const, bytes: facts.bytes, width: facts.width, height: facts.height, sha256: facts.sha256 };
  });
  if ('refused' in outcome) throw outcome.refused;
  return outcome;
}

/** Removes uploads that were presigned but never confirmed (the device gave up or was wiped). */
export async function sweepPendingPhotos(olderThan = new Date(Date.now() - 7 * 24 * 3600 * 1000)) {
  return db().transaction(async (trx) => {
    const stale = await claimStalePendingPhotos(trx, olderThan);
    for (const photo of stale) {
      await deleteObject(photo.object_key).catch(() => undefined);
      await deletePhoto(trx, photo.id);
    }
    return stale.length;
  });
}
