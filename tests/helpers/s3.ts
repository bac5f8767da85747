/** Direct access to the S3 fake the tests run against, to check what the app stored. */
import { GetObjectCommand, HeadObjectCommand, S3Client } from '@aws-sdk/client-s3';

let client: S3Client | undefined;

export function testS3() {
  client ??= new S3Client({
    endpoint: process.env.S3_ENDPOINT,
    region: process.env.S3_REGION ?? 'local',
    forcePathStyle: true,
    credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID!, secretAccessKey: process.env.S3_SECRET_ACCESS_KEY! },
  });
  return client;
}

export async function getObjectBytes(key: string): Promise<Buffer | undefined> {
  try {
    const res = await testS3().send(new GetObjectCommand({ Bucket: process.env.S3_BUCKET!, Key: key }));
    return Buffer.from(await res.Body!.transformToByteArray());
  } catch (err) {
    if ((err as { name?: string }).name === 'NoSuchKey') return undefined;
    throw err;
  }
}

export async function objectExists(key: string) {
  try {
    await testS3().send(new HeadObjectCommand({ Bucket: process.env.S3_BUCKET!, Key: key }));
    return true;
  } catch {
    return false;
  }
}
