/**
 * `npm run storage:cors`: sets the upload CORS rule (lib/storage-cors.ts) on the bucket named by
 * S3_* for the origin in NEXTAUTH_URL (more origins may follow as arguments), then prints the rule
 * the store now holds. Run it once per bucket on a real deployment; the local fake does it itself.
 */
import { S3Client } from '@aws-sdk/client-s3';
import { getEnv } from '../lib/env';
import { applyUploadCors } from '../lib/storage-cors';

async function main() {
  const env = getEnv();
  const origins = [new URL(env.NEXTAUTH_URL).origin, ...process.argv.slice(2).map((o) => new URL(o).origin)];
  const client = new S3Client({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    forcePathStyle: env.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
  });
  const rules = await applyUploadCors(client, env.S3_BUCKET, origins);
  console.log(`Bucket ${env.S3_BUCKET} now allows uploads from ${origins.join(', ')}:`);
  console.log(JSON.stringify(rules, null, 2));
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
