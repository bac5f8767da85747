/**
 * Local stand-in for S3: s3rver on loopback, with the app's bucket and the upload CORS rule that
 * a real bucket gets from `npm run storage:cors`, set the same way, so browsers can PUT to
 * presigned URLs. Used by `npm start` and `npm test` when no real object store is configured.
 * Only credentials S3RVER/S3RVER are accepted.
 */
import { createHash, createHmac } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import type { Server, Socket } from 'node:net';
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

const SECRET = 'S3RVER';
const rfc3986 = (s: string) => encodeURIComponent(s).replace(/[!'()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
const hmac = (key: Buffer | string, data: string) => createHmac('sha256', key).update(data).digest();

/**
 * s3rver does not check version-4 signatures. Real S3 does, and the app relies on it: a presigned
 * upload is bound to its signed headers (type and length) and its expiry. This checks presigned
 * (query-string) requests the way S3 does, so that tests see the same refusals.
 */
function presignedProblem(method: string, url: string, headers: Record<string, string | string[] | undefined>) {
  const parsed = new URL(url, 'http://fake');
  const q = parsed.searchParams;
  if (!q.has('X-Amz-Signature')) return undefined;
  const date = q.get('X-Amz-Date') ?? '';
  const issued = Date.parse(date.replace(/^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z$/, '$1-$2-$3T$4:$5:$6Z'));
  if (!(issued + Number(q.get('X-Amz-Expires')) * 1000 > Date.now())) return 'Request has expired';
  const signed = (q.get('X-Amz-SignedHeaders') ?? '').split(';');
  const canonicalHeaders = signed
    .map(
      (h) =>
        `${h}:${String(headers[h] ?? '')
          .trim()
          .replace(/\s+/g, ' ')}\n`,
    )
    .join('');
  const query = [...q.entries()]
    .filter(([k]) => k !== 'X-Amz-Signature')
    .map(([k, v]) => [rfc3986(k), rfc3986(v)])
    .sort(([a], [b]) => (a! < b! ? -1 : a! > b! ? 1 : 0))
    .map(([k, v]) => `${k}=${v}`)
    .join('&');
  const canonical = [method, parsed.pathname, query, canonicalHeaders, signed.join(';'), 'UNSIGNED-PAYLOAD'].join('\n');
  const scope = (q.get('X-Amz-Credential') ?? '').split('/').slice(1);
  const toSign = ['AWS4-HMAC-SHA256', date, scope.join('/'), createHash('sha256').update(canonical).digest('hex')].join('\n');
  const key = scope.slice(0, 4).reduce<Buffer | string>((k, part) => hmac(k, part), `AWS4${SECRET}`);
  return createHmac('sha256', key).update(toSign).digest('hex') === q.get('X-Amz-Signature') ? undefined : 'SignatureDoesNotMatch';
}

// First in the chain (Koa composes its middleware when the server starts listening).
(server as unknown as { middleware: unknown[] }).middleware.unshift(
  async (ctx: { method: string; url: string; headers: Record<string, string>; status: number; body: unknown; type: string }, next: () => Promise<void>) => {
    // A CORS preflight carries the link's query string but is not what was signed.
    const problem = ctx.method === 'OPTIONS' ? undefined : presignedProblem(ctx.method, ctx.url, ctx.headers);
    if (!problem) return next();
    ctx.status = 403;
    ctx.type = 'application/xml';
    ctx.body = `<?xml version="1.0" encoding="UTF-8"?>\n<Error><Code>${problem === 'SignatureDoesNotMatch' ? problem : 'AccessDenied'}</Code><Message>${problem}</Message></Error>`;
  },
);

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

// Fault tests: SIGUSR1 makes the store go away (connections refused, open ones cut), SIGUSR2
// brings it back on the same port with the same data. SIGSTOP/SIGCONT stall it instead.
const sockets = new Set<Socket>();
let listening: { address: string; port: number } | undefined;
let keepAlive: NodeJS.Timeout | undefined;
const http = () => (server as unknown as { httpServer: Server }).httpServer;
process.on('SIGUSR1', () => {
  const srv = http();
  if (!srv.listening) return;
  listening = srv.address() as { address: string; port: number };
  // s3rver closes its logger when its server closes; this server is coming back.
  srv.removeAllListeners('close');
  srv.close();
  for (const s of sockets) s.destroy();
  // Nothing else keeps the process alive while it is not listening.
  keepAlive ??= setInterval(() => undefined, 60_000);
});
process.on('SIGUSR2', () => {
  if (listening && !http().listening) http().listen(listening.port, listening.address);
});
setImmediate(function watch() {
  const srv = http();
  if (!srv) return setTimeout(watch, 50);
  srv.on('connection', (s: Socket) => {
    sockets.add(s);
    s.once('close', () => sockets.delete(s));
  });
});

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => server.close().finally(() => process.exit(0)));
}
