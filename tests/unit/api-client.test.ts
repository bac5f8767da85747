/** The API client against a real HTTP server on loopback (node:http), not a mocked fetch. */
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiGet, ApiError, apiSend, OFFLINE_MESSAGE, TIMEOUT_MESSAGE } from '@/lib/api-client';
import type { Contract } from '@/lib/contracts/http';
import { responds } from '@/lib/contracts/http';
import type { memberRoute as route } from '@/lib/server/http';

type MemberRoute = typeof route;

let server: Server;
let base: string;
const seen: { method?: string; type?: string; body: string }[] = [];

beforeAll(async () => {
  server = createServer((req, res) => {
    let body = '';
    req.on('data', (c) => (body += c));
    req.on('end', () => {
      seen.push({ method: req.method, type: req.headers['content-type'], body });
      const send = (status: number, text: string, type = 'application/json') => {
        res.writeHead(status, { 'content-type': type });
        res.end(text);
      };
      switch (req.url) {
        case '/ok':
          return send(200, JSON.stringify({ n: 1 }));
        case '/empty':
          res.writeHead(204);
          return res.end();
        case '/invalid':
          return send(422, JSON.stringify({ error: { code: 'invalid-input', message: 'Some fields are not valid.', fields: { name: ['Required'] } } }));
        case '/html-error':
          return send(502, '<html>Bad gateway</html>', 'text/html');
        case '/html-ok':
          return send(200, '<html>Sign in to the wifi</html>', 'text/html');
        case '/slow':
          return setTimeout(() => send(200, '{}'), 2_000);
        default:
          return send(404, JSON.stringify({ error: { code: 'not-found', message: 'No such thing.' } }));
      }
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});

afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

const failure = (p: Promise<unknown>) =>
  p.then(
    () => expect.unreachable('should have failed'),
    (e: unknown) => e as ApiError,
  );

describe('api client', () => {
  it('reads JSON answers and sends JSON bodies', async () => {
    expect(await apiGet<{ n: number }>(`${base}/ok`)).toEqual({ n: 1 });
    await apiSend('POST', `${base}/ok`, { a: 1 });
    expect(seen.at(-1)).toMatchObject({ method: 'POST', type: 'application/json', body: '{"a":1}' });
    expect(await apiSend('DELETE', `${base}/empty`)).toBeUndefined();
    expect(seen.at(-1)).toMatchObject({ method: 'DELETE', body: '' });
  });

  it("carries the server's status, code, message and field errors", async () => {
    const err = await failure(apiSend('POST', `${base}/invalid`, {}));
    expect(err).toBeInstanceOf(ApiError);
    expect([err.status, err.code, err.message, err.fields]).toEqual([422, 'invalid-input', 'Some fields are not valid.', { name: ['Required'] }]);
    const missing = await failure(apiGet(`${base}/nothing`));
    expect([missing.status, missing.code, missing.message]).toEqual([404, 'not-found', 'No such thing.']);
  });

  it("names the status when the error body is not JSON, or uses the caller's words", async () => {
    const err = await failure(apiGet(`${base}/html-error`));
    expect([err.status, err.code, err.message]).toEqual([502, 'http-502', 'The server answered 502.']);
    const worded = await failure(apiGet(`${base}/html-error`, { fallback: 'The plan was not made.' }));
    expect(worded.message).toBe('The plan was not made.');
  });

  it('refuses a 200 that is not JSON (a captive portal, a proxy page)', async () => {
    const err = await failure(apiGet(`${base}/html-ok`));
    expect([err.status, err.code]).toEqual([200, 'bad-response']);
  });

  it('turns no connection into status 0, code offline', async () => {
    const closed = createServer();
    await new Promise<void>((resolve) => closed.listen(0, '127.0.0.1', resolve));
    const port = (closed.address() as AddressInfo).port;
    await new Promise<void>((resolve) => closed.close(() => resolve()));
    const err = await failure(apiGet(`http://127.0.0.1:${port}/ok`));
    expect([err.status, err.code, err.message, err.unanswered]).toEqual([0, 'offline', OFFLINE_MESSAGE, true]);
  });

  it("gives up at its deadline, and rethrows the caller's own abort", async () => {
    const err = await failure(apiGet(`${base}/slow`, { deadlineMs: 100 }));
    expect([err.status, err.code, err.message]).toEqual([0, 'timeout', TIMEOUT_MESSAGE]);
    const controller = new AbortController();
    const pending = apiGet(`${base}/slow`, { signal: controller.signal });
    controller.abort();
    await expect(pending).rejects.not.toBeInstanceOf(ApiError);
  });
});

describe('response contracts', () => {
  it("add nothing to a route's options at run time", () => {
    const marker: Contract<{ n: number }> = responds<{ n: number }>();
    expect(Object.keys(marker)).toEqual([]);
  });

  // Checked by tsc (npm test type-checks tests too): never called.
  function compileChecks(memberRoute: MemberRoute) {
    memberRoute({ response: responds<{ n: number }>() }, async () => ({ n: 1 }));
    // @ts-expect-error a handler answering another shape does not compile
    memberRoute({ response: responds<{ n: number }>() }, async () => ({ n: 'one' }));
    // @ts-expect-error nor one that leaves a field out
    memberRoute({ response: responds<{ n: number; m: number }>() }, async () => ({ n: 1 }));
    // A Date goes out as the ISO text the contract names.
    memberRoute({ response: responds<{ at: string }>() }, async () => ({ at: new Date() }));
  }
  it('are checked at compile time', () => expect(compileChecks).toBeTypeOf('function'));
});
