import http from 'node:http';
import { gunzipSync } from 'node:zlib';

/**
 * Requests over one kept-alive node:http connection, gzip accepted as a browser accepts it, so a
 * figure is the server's: undici's fetch adds a few milliseconds of its own per request on this
 * 2-core machine (the benches print its figure apart), which a phone or a browser spends on its own.
 */
export function keptAlive(base: string, cookie: string) {
  const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
  const send = (method: 'GET' | 'POST', path: string, body?: unknown) => {
    const text = body === undefined ? undefined : JSON.stringify(body);
    const headers: http.OutgoingHttpHeaders = { 'accept-encoding': 'gzip', cookie };
    if (text !== undefined) Object.assign(headers, { 'content-type': 'application/json', 'content-length': Buffer.byteLength(text) });
    return new Promise<{ status: number; headers: http.IncomingHttpHeaders; text: string }>((resolve, reject) => {
      const req = http.request(new URL(path, base), { method, agent, headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => {
          const bytes = Buffer.concat(chunks);
          const plain = res.headers['content-encoding'] === 'gzip' ? gunzipSync(bytes) : bytes;
          resolve({ status: res.statusCode ?? 0, headers: res.headers, text: plain.toString('utf8') });
        });
        res.on('error', reject);
      });
      req.on('error', reject);
      req.end(text);
    });
  };
  return {
    get: (path: string) => send('GET', path),
    post: async (path: string, body: unknown) => {
      const res = await send('POST', path, body);
      return { status: res.status, json: JSON.parse(res.text) as unknown };
    },
    close: () => agent.destroy(),
  };
}
