import 'server-only';
import { GetObjectCommand, HeadBucketCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { getEnv } from '@/lib/env';

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
    });
  }
  return store.vinewardS3;
}

export const bucket = () => getEnv().S3_BUCKET;

export async function storageReachable(): Promise<boolean> {
  try {
    await s3().send(new HeadBucketCommand({ Bucket: bucket() }), { abortSignal: AbortSignal.timeout(3000) });
    return true;
  } catch {
    return false;
  }
}

export { photoKey, thumbKey } from '@/lib/storage-keys';

export const PRESIGN_SECONDS = 300;

export function presignGet(key: string, seconds = PRESIGN_SECONDS) {
  return getSignedUrl(s3(), new GetObjectCommand({ Bucket: bucket(), Key: key }), { expiresIn: seconds });
}

export function presignPut(key: string, contentType: string, seconds = PRESIGN_SECONDS) {
  return getSignedUrl(s3(), new PutObjectCommand({ Bucket: bucket(), Key: key, ContentType: contentType }), { expiresIn: seconds });
}
