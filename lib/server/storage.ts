import 'server-only';
import { DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { getEnv } from '@/lib/env';
import { AppError } from '@/lib/server/errors';

const store = globalThis as unknown as { vinewardS3?: S3Client };

export function s3() {
  if (!store.vinewardS3) {
    const env = getEnv();
    store.vinewardS3 = new S3Client({
      endpoint: env.S3_ENDPOINT,
      region: env.S3_REGION,
      forcePathStyle: env.S3_FORCE_PATH_STYLE,
      credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
      // Real S3 enforces checksums that presigned browser uploads cannot carry.
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
      // The Node handler's own deadlines: to open a connection, until the store starts answering
      // (only a warning unless throwOnRequestTimeout), and for a silent socket while bytes flow.
      // One retry only, so a stalled store costs at most two of them.
      requestHandler: {
        connectionTimeout: env.S3_CONNECT_TIMEOUT_MS,
        requestTimeout: env.S3_REQUEST_TIMEOUT_MS,
        throwOnRequestTimeout: true,
        socketTimeout: env.S3_REQUEST_TIMEOUT_MS,
      },
      maxAttempts: 2,
    });
  }
  return store.vinewardS3;
}

export const bucket = () => getEnv().S3_BUCKET;

/** What a person is told when object storage is slow or down; the device retries later. */
export const STORAGE_RETRY_SECONDS = 30;

function storageDown(err: unknown): boolean {
  const e = err as { name?: string; code?: string; $metadata?: { httpStatusCode?: number } };
  if (['TimeoutError', 'AbortError', 'RequestTimeout', 'RequestTimeoutException', 'ServiceUnavailable', 'SlowDown'].includes(e.name ?? '')) return true;
  if (['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND'].includes(e.code ?? '')) return true;
  return (e.$metadata?.httpStatusCode ?? 0) >= 500;
}

/**
 * Every call to object storage goes through here: one overall deadline (the handler's timeouts
 * cover connecting and silence, this covers a slow trickle), and a store that is down or slow
 * becomes 503 with Retry-After, never a hang or a 500.
 */
export async function storageCall<T>(call: (abortSignal: AbortSignal) => Promise<T>): Promise<T> {
  try {
    return await call(AbortSignal.timeout(getEnv().S3_CALL_TIMEOUT_MS));
  } catch (err) {
    if (storageDown(err)) {
      throw new AppError('unavailable', 'Photo storage is not answering right now. Your photo stays on the device and is sent later.', undefined, {
        'retry-after': String(STORAGE_RETRY_SECONDS),
      });
    }
    throw err;
  }
}

/** The object's length and bytes, or undefined when there is none. */
export async function readObject(key: string, maxBytes: number) {
  return storageCall(async (abortSignal) => {
    try {
      const res = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }), { abortSignal });
      const length = Number(res.ContentLength ?? 0);
      if (length > maxBytes) {
        // Not read: the caller refuses it by its length alone.
        (res.Body as { destroy?: () => void } | undefined)?.destroy?.();
        return { length, bytes: undefined };
      }
      return { length, bytes: Buffer.from(await res.Body!.transformToByteArray()) };
    } catch (err) {
      if ((err as { name?: string }).name === 'NoSuchKey') return undefined;
      throw err;
    }
  });
}

export function putObject(key: string, body: Buffer, contentType: string) {
  return storageCall((abortSignal) => s3().send(new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentType: contentType }), { abortSignal }));
}

export function deleteObject(key: string) {
  return storageCall((abortSignal) => s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }), { abortSignal }));
}

/**
 * Keys under a prefix last written before a time, page by page (keys list by name, not age, so an
 * old key can stand on any page). Each page is one call with its own deadline.
 */
export async function* listObjectsBefore(prefix: string, before: Date) {
  let token: string | undefined;
  do {
    const res = await storageCall((abortSignal) =>
      s3().send(new ListObjectsV2Command({ Bucket: bucket(), Prefix: prefix, ContinuationToken: token }), { abortSignal }),
    );
    yield (res.Contents ?? []).filter((o) => o.Key && o.LastModified && o.LastModified < before).map((o) => o.Key!);
    token = res.IsTruncated ? res.NextContinuationToken : undefined;
  } while (token);
}

export async function storageReachable(): Promise<boolean> {
  try {
    await s3().send(new HeadBucketCommand({ Bucket: bucket() }), { abortSignal: AbortSignal.timeout(3000) });
    return true;
  } catch {
    return false;
  }
}

export { photoKey, thumbKey, uploadKey } from '@/lib/storage-keys';

export const PRESIGN_SECONDS = 300;

export function presignGet(key: string, seconds = PRESIGN_SECONDS) {
  return getSignedUrl(s3(), new GetObjectCommand({ Bucket: bucket(), Key: key }), { expiresIn: seconds });
}

/**
 * A link to PUT one upload: bound to the declared type and size (both are signed headers, so a
 * different body length or type is refused by the store) and short-lived.
 */
export function presignUpload(key: string, contentType: string, bytes: number) {
  return getSignedUrl(s3(), new PutObjectCommand({ Bucket: bucket(), Key: key, ContentType: contentType, ContentLength: bytes }), {
    expiresIn: getEnv().PHOTO_UPLOAD_LINK_SECONDS,
    signableHeaders: new Set(['content-type', 'content-length']),
  });
}
