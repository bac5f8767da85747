/**
 * The bucket's CORS rule that phone uploads need: the browser PUTs a photo straight to object
 * storage with a presigned URL, from the app's origin. One definition serves the local S3 fake and
 * `npm run storage:cors`, which sets it on a real bucket (AWS S3, MinIO, Cloudflare R2 and other
 * S3-compatible stores accept PutBucketCors).
 */
import { GetBucketCorsCommand, PutBucketCorsCommand, type CORSRule, type S3Client } from '@aws-sdk/client-s3';

export function uploadCorsRules(origins: string[]): CORSRule[] {
  return [
    {
      AllowedOrigins: origins,
      AllowedMethods: ['GET', 'PUT', 'HEAD'],
      // The presigned PUT carries Content-Type (part of the signature); '*' also covers what a store adds.
      AllowedHeaders: ['*'],
      ExposeHeaders: ['ETag'],
      MaxAgeSeconds: 3000,
    },
  ];
}

export async function applyUploadCors(client: S3Client, bucket: string, origins: string[], timeoutMs = 10_000) {
  const abortSignal = AbortSignal.timeout(timeoutMs);
  await client.send(new PutBucketCorsCommand({ Bucket: bucket, CORSConfiguration: { CORSRules: uploadCorsRules(origins) } }), { abortSignal });
  const { CORSRules } = await client.send(new GetBucketCorsCommand({ Bucket: bucket }), { abortSignal });
  return CORSRules ?? [];
}
