import 'server-only';
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import exifr from 'exifr';
import sharp from 'sharp';
import type { z } from 'zod';
import { getEnv } from '@/lib/env';
import { Semaphore } from '@/lib/semaphore';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { getObservation } from '@/lib/server/queries/observations';
import { getOrganisation } from '@/lib/server/queries/organisations';
import {
  claimPhotoForConfirm,
  claimStalePendingPhotos,
  deleteClaimedPhoto,
  getPhoto,
  insertPendingPhoto,
  markPhotoStored,
  prepareUpload,
  releasePhotoClaim,
  uploadKeysInUse,
  type PhotoRow,
} from '@/lib/server/queries/photos';
import { deleteObject, listObjectsBefore, photoKey, presignUpload, putObject, readObject, thumbKey, uploadKey } from '@/lib/server/storage';
import { PHOTO_MAX_BYTES, PHOTO_MAX_LONG_SIDE, THUMB_LONG_SIDE, THUMB_QUALITY, UPLOAD_PREFIX } from '@/lib/storage-keys';
import type { presignPhotoSchema } from '@/lib/validation/photo';

const IMAGE_FORMATS = new Set(['jpeg', 'png', 'webp', 'heif']);

/**
 * How long a confirm (or a sweep) holds a photo. Longer than the worst case of one confirm: three
 * storage calls in a row (S3_CALL_TIMEOUT_MS each, 20 s by default), the wait for an image slot
 * (IMAGE_WAIT_MS) and sharp's own timeout (IMAGE_SECONDS); so a lease only runs out when its
 * server died, and then the next confirm may take over.
 */
const LEASE_SECONDS = 120;
/** Waiting for one of the server's image slots; past it the confirm answers 503 "busy". */
const IMAGE_WAIT_MS = 10_000;
const IMAGE_SECONDS = 20;
/** A retry after a refusal to wait is soon worth it: the photo is already uploaded. */
const BUSY_RETRY_SECONDS = 5;
/** Uploads that no pending photo waits on are removed this long after they were written. */
const ORPHAN_UPLOAD_MS = 60 * 60 * 1000;

const slots = globalThis as unknown as { vinewardImageSlots?: Semaphore };
const imageSlots = () => (slots.vinewardImageSlots ??= new Semaphore(getEnv().IMAGE_CONCURRENCY));

const busy = (message: string) => new AppError('unavailable', message, undefined, { 'retry-after': String(BUSY_RETRY_SECONDS) });

/**
 * Step 1 of an upload: a row marked pending, and a short-lived URL to PUT the bytes to object
 * storage, at an upload key that is never served and bound to the declared type and size.
 * Calling it again for the same id is safe: a stored photo answers "stored" and needs no upload;
 * a pending one gets a fresh URL to the same upload key.
 */
export async function presignPhoto(member: Member, input: z.infer<typeof presignPhotoSchema>) {
  const observation = await getObservation(db(), member.organisationId, input.observationId);
  if (!observation) throw new AppError('not-found', 'No such observation in your organisation. Sync the observation first.');
  const freshKey = uploadKey(member.organisationId, input.id, randomBytes(12).toString('base64url'));
  const row = await insertPendingPhoto(db(), {
    id: input.id,
    organisationId: member.organisationId,
    observationId: input.observationId,
    uploadedBy: member.userId,
    objectKey: photoKey(member.organisationId, input.id),
    uploadKey: freshKey,
    takenAt: input.takenAt ?? null,
  });
  if (row.organisation_id !== member.organisationId || row.observation_id !== input.observationId) {
    throw new AppError('conflict', 'This photo id is already used by another photo.');
  }
  if (row.status === 'stored') return { id: row.id, status: 'stored' as const };
  const key = await prepareUpload(db(), row.id, { contentType: input.contentType, bytes: input.bytes, freshKey });
  // Confirmed between the two statements by another request of the same device.
  if (!key) return { id: row.id, status: 'stored' as const };
  return {
    id: row.id,
    status: 'pending' as const,
    uploadUrl: await presignUpload(key, input.contentType, input.bytes),
    headers: { 'content-type': input.contentType },
  };
}

async function readLocation(bytes: Buffer) {
  try {
    const gps = await exifr.gps(bytes);
    return gps ? { latitude: gps.latitude, longitude: gps.longitude } : { latitude: null, longitude: null };
  } catch {
    return { latitude: null, longitude: null };
  }
}

const storedFacts = (row: PhotoRow) => ({
  id: row.id,
  status: 'stored' as const,
  bytes: Number(row.bytes),
  width: row.width,
  height: row.height,
  sha256: row.sha256,
});

/** Verifies and re-encodes an upload, in one of the server's image slots, within the pixel limit. */
async function processImage(original: Buffer, keepLocation: boolean) {
  const release = await imageSlots().acquire(IMAGE_WAIT_MS);
  if (!release) throw busy('The server is busy with other photos; yours is kept and sent again shortly.');
  try {
    const maxPixels = getEnv().PHOTO_MAX_PIXELS;
    const input = { limitInputPixels: maxPixels, failOn: 'error' as const };
    // metadata() reads the header only: the pixel count is known before anything is decoded
    // (with the limit set, sharp would refuse the header too, and say nothing useful).
    const meta = await sharp(original, { limitInputPixels: false })
      .metadata()
      .catch(() => undefined);
    if (!meta?.format || !IMAGE_FORMATS.has(meta.format) || !meta.width || !meta.height) {
      return { refused: new AppError('invalid-input', 'That file is not a photo (JPEG, PNG or WebP). It was not kept.') };
    }
    const pixels = meta.width * meta.height * (meta.pages ?? 1);
    if (pixels > maxPixels) {
      const mp = (n: number) => (n / 1_000_000).toFixed(n < 10_000_000 ? 1 : 0);
      return {
        refused: new AppError(
          'invalid-input',
          `That image is ${meta.width} × ${meta.height} pixels (${mp(pixels)} megapixels); photos may have at most ${mp(maxPixels)} megapixels. ` +
            `The app downscales photos to ${PHOTO_MAX_LONG_SIDE} px before sending them. It was not kept.`,
        ),
      };
    }
    const location = keepLocation ? await readLocation(original) : { latitude: null, longitude: null };
    // sharp drops all metadata unless told to keep it: that is the stripping.
    // Both come from the original at once: the thumbnail decodes it at reduced scale, which is far
    // cheaper than decoding the re-encoded copy again.
    const encoded = await Promise.all([
      sharp(original, input)
        .timeout({ seconds: IMAGE_SECONDS })
        .rotate()
        .resize({ width: PHOTO_MAX_LONG_SIDE, height: PHOTO_MAX_LONG_SIDE, fit: 'inside', withoutEnlargement: true })
        .jpeg({ quality: 85 })
        .toBuffer({ resolveWithObject: true }),
      sharp(original, input)
        .timeout({ seconds: IMAGE_SECONDS })
        .rotate()
        .resize({ width: THUMB_LONG_SIDE, height: THUMB_LONG_SIDE, fit: 'inside', withoutEnlargement: true })
        .jpeg({ quality: THUMB_QUALITY })
        .toBuffer(),
    ]).catch((err: Error) => {
      // Out of time is the server's trouble, not the photo's: keep it for a retry.
      if (/timeout/i.test(err.message)) throw busy('The server took too long over this photo; it is kept and sent again shortly.');
      return undefined;
    });
    if (!encoded) return { refused: new AppError('invalid-input', 'That photo could not be read (damaged or incomplete). It was not kept.') };
    const [{ data: stored, info }, thumb] = encoded;
    return { stored, thumb, width: info.width, height: info.height, location };
  } finally {
    release();
  }
}

/**
 * Step 2: the server reads what was uploaded and only then marks it stored. The bytes must really
 * be an image (sharp decodes them; the name or type claimed means nothing) within the pixel limit.
 * It is turned upright by its EXIF orientation, re-encoded without location or camera metadata,
 * written to the served key with a thumbnail, and its size, dimensions and checksum are recorded.
 * The upload is then deleted. Anything refused is deleted from storage.
 *
 * No transaction or pooled connection is held while object storage or sharp works: the row is
 * claimed by one short UPDATE (a lease, so two confirms of one photo never both work), the
 * reading, checking and writing happen with no connection held, and one more short UPDATE
 * records the result only if the claim still holds. Failure windows:
 * - dies or times out after the claim: the lease runs out (or a 503/409 gives the claim back at
 *   once) and the device's next confirm starts over; nothing is stored yet, or the served copy was
 *   written for a row still pending, which nobody serves and the retry overwrites with the same bytes;
 * - dies after recording, before the upload is deleted: the upload is left under `uploads/`, where
 *   the hourly sweep removes uploads no pending photo waits on;
 * - a PUT to the upload link after confirm writes only to the upload key, which is never served.
 */
export async function confirmPhoto(member: Member, id: string) {
  const claim = randomUUID();
  const row = await claimPhotoForConfirm(db(), member.organisationId, id, claim, LEASE_SECONDS);
  if (!row) {
    const current = await getPhoto(db(), id);
    if (!current || current.organisation_id !== member.organisationId) throw new AppError('not-found', 'No such photo in your organisation.');
    if (current.status === 'stored') return storedFacts(current);
    throw busy('This photo is being confirmed right now; try again in a moment.');
  }
  try {
    return await confirmClaimed(member, row, claim);
  } catch (err) {
    await releasePhotoClaim(db(), id, claim).catch(() => undefined);
    throw err;
  }
}

async function confirmClaimed(member: Member, row: PhotoRow, claim: string) {
  const id = row.id;
  const upload = row.upload_key ?? row.object_key;
  const refuse = async (error: AppError): Promise<never> => {
    // The object first: if storage is down this throws 503 and the row stays for a retry.
    await deleteObject(upload);
    await deleteClaimedPhoto(db(), id, claim);
    throw error;
  };

  const object = await readObject(upload, PHOTO_MAX_BYTES);
  if (!object) throw new AppError('conflict', 'The photo has not been uploaded yet. Upload it, then confirm again.');
  if (!object.bytes) return refuse(new AppError('payload-too-large', `The photo is larger than ${PHOTO_MAX_BYTES / 1024 / 1024} MB.`));

  const organisation = await getOrganisation(db(), member.organisationId);
  const image = await processImage(object.bytes, Boolean(organisation?.keep_photo_location));
  if ('refused' in image) return refuse(image.refused!);

  const facts = {
    thumbKey: thumbKey(member.organisationId, id),
    bytes: image.stored.length,
    width: image.width,
    height: image.height,
    sha256: createHash('sha256').update(image.stored).digest('hex'),
    ...image.location,
  };
  await Promise.all([putObject(row.object_key, image.stored, 'image/jpeg'), putObject(facts.thumbKey, image.thumb, 'image/jpeg')]);
  if (!(await markPhotoStored(db(), id, claim, facts))) {
    // Our lease ran out and another confirm took over: its answer stands.
    const current = await getPhoto(db(), id);
    if (current?.status === 'stored') return storedFacts(current);
    throw busy('This photo is being confirmed right now; try again in a moment.');
  }
  if (upload !== row.object_key) {
    await deleteObject(upload).catch((err) => console.error(`Upload ${upload} was not deleted after confirm (the sweep removes it):`, err));
  }
  return { id, status: 'stored' as const, bytes: facts.bytes, width: facts.width, height: facts.height, sha256: facts.sha256 };
}

/**
 * Removes uploads that were presigned but never confirmed (the device gave up or was wiped), and
 * uploads that no pending photo waits on any more (a PUT after its photo was confirmed or
 * refused). Rows are claimed like a confirm claims them; storage is called with no transaction open.
 */
export async function sweepPendingPhotos(olderThan = new Date(Date.now() - 7 * 24 * 3600 * 1000), orphansBefore = new Date(Date.now() - ORPHAN_UPLOAD_MS)) {
  const claim = randomUUID();
  const stale = await claimStalePendingPhotos(db(), olderThan, claim, LEASE_SECONDS);
  let removed = 0;
  for (const photo of stale) {
    try {
      const keys = new Set([photo.upload_key, photo.object_key, photo.thumb_key].filter((k): k is string => Boolean(k)));
      for (const key of keys) await deleteObject(key);
      removed += await deleteClaimedPhoto(db(), photo.id, claim);
    } catch (err) {
      await releasePhotoClaim(db(), photo.id, claim).catch(() => undefined);
      console.error(`Sweeping the unconfirmed photo ${photo.id} failed; the next sweep tries again:`, err);
    }
  }
  for await (const old of listObjectsBefore(UPLOAD_PREFIX, orphansBefore)) {
    const inUse = await uploadKeysInUse(db(), old);
    for (const key of old) {
      if (inUse.has(key)) continue;
      // One refused delete leaves that upload for the next sweep, not the rest of the page.
      await deleteObject(key).catch((err: unknown) => console.error(`Removing the orphan upload ${key} failed; the next sweep tries again:`, err));
    }
  }
  return removed;
}
