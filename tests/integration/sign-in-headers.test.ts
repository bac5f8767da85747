import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startNext } from '../../scripts/lib/app';
import { stopChild } from '../../scripts/lib/services';
import { closeTestDb, makeTeam, PASSWORD } from '../helpers/fixtures';
import { APP_URL, Client } from '../helpers/http';
import { limiterKeys, resetClientLimits } from '../helpers/limits';

/**
 * The app `npm test` started has no proxy in front (TRUSTED_PROXY_HOPS unset). A second server from
 * the same build plays the app behind one proxy (a TLS-terminating load balancer), which is the only
 * way a plain-HTTP `next start` can learn that the person's connection was https.
 */
const proxiedPort = new URL(APP_URL).port ? Number(new URL(APP_URL).port) + 5 : 3105;
const PROXIED = `http://127.0.0.1:${proxiedPort}`;
let proxied: ChildProcess | undefined;

beforeAll(async () => {
  proxied = await startNext(proxiedPort, { ...process.env, TRUSTED_PROXY_HOPS: '1', NEXTAUTH_URL: `http://localhost:${proxiedPort}` });
}, 90_000);

afterAll(async () => {
  if (proxied) await stopChild(proxied);
  await resetClientLimits();
  await closeTestDb();
});

const HSTS = /^max-age=\d{7,}; includeSubDomains$/;

describe('Strict-Transport-Security', () => {
  it('is not sent over plain http, even when the client itself claims https', async () => {
    for (const path of ['/signin', '/api/health', '/offline']) {
      expect((await fetch(new URL(path, APP_URL))).headers.get('strict-transport-security')).toBeNull();
      const claimed = await fetch(new URL(path, APP_URL), { headers: { 'x-forwarded-proto': 'https' } });
      expect(claimed.headers.get('strict-transport-security')).toBeNull();
    }
  });

  it('is sent when a trusted proxy reports the connection was https, and only then', async () => {
    const secure = await fetch(`${PROXIED}/signin`, { headers: { 'x-forwarded-proto': 'https' } });
    // RFC 6797 §6.1.1: max-age is required; a year or more is what browsers' preload lists ask for.
    expect(secure.headers.get('strict-transport-security')).toMatch(HSTS);
    expect(Number(/max-age=(\d+)/.exec(secure.headers.get('strict-transport-security')!)![1])).toBeGreaterThanOrEqual(31_536_000);
    const plain = await fetch(`${PROXIED}/signin`, { headers: { 'x-forwarded-proto': 'http' } });
    expect(plain.headers.get('strict-transport-security')).toBeNull();
  });
});

describe('the client address behind a configured proxy', () => {
  it('counts failures under the address the proxy appended, not what the client wrote before it', async () => {
    const { scout } = await makeTeam();
    const csrfRes = await fetch(`${PROXIED}/api/auth/csrf`);
    const jar = csrfRes.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; ');
    const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
    const res = await fetch(`${PROXIED}/api/auth/callback/credentials`, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar, 'x-forwarded-for': '203.0.113.1, 198.51.100.23' },
      body: new URLSearchParams({ email: scout.email, password: 'wrong', csrfToken, json: 'true' }),
    });
    expect(res.status).toBe(401);
    const keys = await limiterKeys('signin-ip');
    expect(keys.get('198.51.100.23')).toBe(1);
    expect(keys.has('203.0.113.1')).toBe(false);
  });
});

describe('Content-Security-Policy', () => {
  it('allows no inline script by permission: script-src carries a fresh nonce instead of unsafe-inline', async () => {
    const nonces = new Set<string>();
    for (const path of ['/signin', '/offline', '/signin']) {
      const res = await fetch(new URL(path, APP_URL));
      const csp = res.headers.get('content-security-policy')!;
      const scriptSrc = csp
        .split(';')
        .map((d) => d.trim())
        .find((d) => d.startsWith('script-src '))!;
      expect(scriptSrc).not.toContain("'unsafe-inline'");
      expect(scriptSrc).not.toContain("'unsafe-eval'");
      const nonce = /'nonce-([A-Za-z0-9+/=_-]+)'/.exec(scriptSrc)?.[1];
      expect(nonce, scriptSrc).toBeTruthy();
      nonces.add(nonce!);
      // Every inline script in the page carries it, so the page still runs.
      const html = await res.text();
      const scripts = [...html.matchAll(/<script\b([^>]*)>/g)].map((m) => m[1]!);
      expect(scripts.length).toBeGreaterThan(0);
      for (const attrs of scripts) expect(attrs, `${path}: <script${attrs}>`).toContain(`nonce="${nonce}"`);
    }
    expect(nonces.size).toBe(3);
  });
});

describe('signing out', () => {
  it('tells the browser to drop its HTTP cache for the site, and nothing the outbox lives in', async () => {
    const { scout } = await makeTeam();
    const client = new Client();
    await client.signIn(scout.email, PASSWORD);
    const csrfToken = await client.csrf();
    const res = await client.postForm('/api/auth/signout', { csrfToken, json: 'true' });
    expect(res.status).toBe(200);
    expect(client.signedIn).toBe(false);
    // W3C Clear Site Data: "cache" is the HTTP cache (a photo's redirect may sit there a minute);
    // "storage" would take IndexedDB and with it the unsent outbox.
    expect(res.headers.get('clear-site-data')).toBe('"cache"');
  });
});
