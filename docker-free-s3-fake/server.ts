/**
 * Local stand-in for S3: s3rver on loopback, with the app's bucket and the upload CORS rule that
 * a real bucket gets from `npm run storage:cors`, set the same way, so browsers can PUT to
 * presigned URLs. Used by `npm start` and `npm test` when no real object store is configured.
 * Only credentials S3RVER/S3RVER are accepted.
 */
import { mkdirSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { S3Client } from '@aws-sdk/client-s3';
import S3rver from 's3rver';
import { applyUploadCors } from '../lib/storage-cors';

const { values } = parseArgs({
  options: {
    port: { type: 'string', default: '4569' },
    dir: { type: 'string', default: '.data/s3' },
    bucket: { type: 'string', default: 'vineward' },
    origin: { type: 'string', multiple: true, default: ['http://localhost:3000'] },
  },
});

mkdirSync(values.dir, { recursive: true });
const server = new S3rver({
  address: '127.0.0.1',
  port: Number(values.port),
  directory: values.dir,
  silent: true,
  configureBuckets: [{ name: values.bucket, configs: [] }],
});

server.run().then(
  async ({ address, port }: { address: string; port: number }) => {
    const client = new S3Client({
      endpoint: `http://${address}:${port}`,
      region: 'local',
      forcePathStyle: true,
      credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    });
    await applyUploadCors(client, values.bucket, values.origin);
    client.destroy();
    console.log(`s3-fake listening on http://${address}:${port} (bucket ${values.bucket})`);
  },
  (err: unknown) => {
    console.error('s3-fake failed to start:', err);
    process.exit(1);
  },
);

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => server.close().finally(() => process.exit(0)));
}
