/**
 * Local stand-in for S3: s3rver on loopback, with the app's bucket and a CORS rule so that
 * browsers can PUT to presigned URLs. Used by `npm start` and `npm test` when no real
 * object store is configured. Only credentials S3RVER/S3RVER are accepted.
 */
import { mkdirSync } from 'node:fs';
import { parseArgs } from 'node:util';
import S3rver from 's3rver';

const { values } = parseArgs({
  options: {
    port: { type: 'string', default: '4569' },
    dir: { type: 'string', default: '.data/s3' },
    bucket: { type: 'string', default: 'vineward' },
    origin: { type: 'string', multiple: true, default: ['http://localhost:3000'] },
  },
});

const origins = values.origin.map((o) => `<AllowedOrigin>${o}</AllowedOrigin>`).join('');
const cors = `<CORSConfiguration><CORSRule>${origins}
  <AllowedMethod>GET</AllowedMethod><AllowedMethod>PUT</AllowedMethod><AllowedMethod>HEAD</AllowedMethod>
  <AllowedHeader>*</AllowedHeader><ExposeHeader>ETag</ExposeHeader><MaxAgeSeconds>3000</MaxAgeSeconds>
</CORSRule></CORSConfiguration>`;

mkdirSync(values.dir, { recursive: true });
const server = new S3rver({
  address: '127.0.0.1',
  port: Number(values.port),
  directory: values.dir,
  silent: true,
  configureBuckets: [{ name: values.bucket, configs: [cors] }],
});

server.run().then(
  ({ address, port }: { address: string; port: number }) => {
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
