/**
 * Where photos live in the bucket: namespaced by organisation. The bucket is private and every read
 * goes through a short-lived presigned URL handed out after the guard, so keys need not be secret.
 * Pure, so that seeds and scripts use the same layout as the server.
 */
export const photoKey = (organisationId: string, photoId: string) => `orgs/${organisationId}/photos/${photoId}.jpg`;
/**
 * Where a device PUTs a photo before confirm: never a key that is served, with a random part
 * chosen once per photo, so that an upload link cannot write over a stored photo.
 */
export const UPLOAD_PREFIX = 'uploads/';
export const uploadKey = (organisationId: string, photoId: string, nonce: string) => `${UPLOAD_PREFIX}${organisationId}/${photoId}-${nonce}`;
export const thumbKey = (organisationId: string, photoId: string) => `orgs/${organisationId}/photos/${photoId}.thumb.jpg`;

/** Thumbnails: long side in pixels, JPEG quality. */
export const THUMB_LONG_SIDE = 320;
export const THUMB_QUALITY = 70;
/** Devices downscale before queueing; the server refuses anything larger. */
export const PHOTO_MAX_LONG_SIDE = 2048;
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024;
