/**
 * The request boundary (issue 12, findings 5, 7 and the body, mail and invitation parts of 8):
 * cross-site mutations, ids that are not UUIDs, bodies bounded while they stream, mail templates
 * that keep what people wrote, and invitations limited per manager and revocable.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeMember, makeTeam, PASSWORD, testDb, uniqueEmail } from '../helpers/fixtures';
import { APP_URL, Client } from '../helpers/http';
import { firstLink, waitForMail } from '../helpers/mail';
import { raw } from '../helpers/raw';

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let manager: Client;

beforeAll(async () => {
  team = await makeTeam();
  manager = new Client();
  await manager.signIn(team.manager.email, PASSWORD);
});
afterAll(closeTestDb);

const invitationsTo = async (email: string) => Number((await testDb()('invitations').where({ email }).count<{ count: string }[]>())[0]!.count);
const tokenFrom = (link: string) => new URL(link).pathname.split('/').pop()!;

describe('cross-site requests (finding 5)', () => {
  it('refuses a text/plain POST from a foreign Origin that carries a manager’s cookie, and creates no invitation', async () => {
    const email = uniqueEmail('csrf');
    const res = await manager.fetch('/api/invitations', {
      method: 'POST',
      headers: { 'content-type': 'text/plain', origin: 'https://evil.example' },
      body: JSON.stringify({ email, role: 'manager' }),
    });
    expect(res.status).toBe(403);
    expect((await res.json()).error.code).toBe('cross-site');
    expect(await invitationsTo(email)).toBe(0);
  });

  it('refuses JSON from a foreign Origin, from Origin null, and a request the browser marks Sec-Fetch-Site: cross-site', async () => {
    const email = uniqueEmail('csrf-json');
    for (const headers of [
      { origin: 'https://evil.example' },
      { origin: 'null' },
      { 'sec-fetch-site': 'cross-site' },
      { origin: `${APP_URL}.evil.example` },
    ] as Record<string, string>[]) {
      const res = await manager.fetch('/api/invitations', {
        method: 'POST',
        headers: { 'content-type': 'application/json', ...headers },
        body: JSON.stringify({ email, role: 'manager' }),
      });
      expect(res.status, JSON.stringify(headers)).toBe(403);
      expect((await res.json()).error.code).toBe('cross-site');
    }
    // The same holds for PUT, PATCH and DELETE.
    const put = await manager.fetch('/api/notifications/preferences', {
      method: 'PUT',
      headers: { 'content-type': 'application/json', origin: 'https://evil.example' },
      body: JSON.stringify({ assignment: false, comment: false, mention: false, overdue: false, digest: false }),
    });
    expect(put.status).toBe(403);
    const del = await manager.fetch(`/api/measurements/${randomUUID()}`, { method: 'DELETE', headers: { origin: 'https://evil.example' } });
    expect(del.status).toBe(403);
    expect(await invitationsTo(email)).toBe(0);
  });

  it('refuses a body that is not JSON with 415 even without an Origin, and stores nothing', async () => {
    const email = uniqueEmail('plain');
    for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x']) {
      const res = await manager.fetch('/api/invitations', {
        method: 'POST',
        headers: { 'content-type': type },
        body: JSON.stringify({ email, role: 'scout' }),
      });
      expect(res.status, type).toBe(415);
      expect((await res.json()).error.code).toBe('unsupported-media-type');
    }
    const none = await raw({ path: '/api/invitations', headers: { cookie: manager.cookieHeader }, body: JSON.stringify({ email, role: 'scout' }) });
    expect(none.status).toBe(415);
    expect(await invitationsTo(email)).toBe(0);
  });

  it('accepts JSON from the app’s own origin, from a proxy’s forwarded host, and from scripts that send no Origin', async () => {
    const own = await manager.fetch('/api/invitations', {
      method: 'POST',
      headers: { 'content-type': 'application/json; charset=utf-8', origin: APP_URL, 'sec-fetch-site': 'same-origin' },
      body: JSON.stringify({ email: uniqueEmail('own'), role: 'scout' }),
    });
    expect(own.status).toBe(201);
    // Behind a TLS proxy the browser's Origin is the public https address; the proxy forwards that host.
    const proxied = await manager.fetch('/api/invitations', {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: 'https://vines.example.com', 'x-forwarded-host': 'vines.example.com' },
      body: JSON.stringify({ email: uniqueEmail('proxied'), role: 'scout' }),
    });
    expect(proxied.status).toBe(201);
    // NEXTAUTH_URL is the app's public address (http://localhost:<port> in tests), whatever Host says.
    const byHost = await raw({
      path: '/api/invitations',
      headers: { cookie: manager.cookieHeader, host: 'internal-name:8080', origin: APP_URL, 'content-type': 'application/json' },
      body: JSON.stringify({ email: uniqueEmail('public-url'), role: 'scout' }),
    });
    expect(byHost.status).toBe(201);
    const script = await manager.json('/api/invitations', 'POST', { email: uniqueEmail('script'), role: 'scout' });
    expect(script.status).toBe(201);
  });

  it('still answers reads from anywhere (the browser keeps a foreign page from reading them)', async () => {
    const res = await manager.fetch('/api/me', { headers: { origin: 'https://evil.example', 'sec-fetch-site': 'cross-site' } });
    expect(res.status).toBe(200);
  });
});

describe('ids that are not UUIDs (finding 7)', () => {
  it('answers 422 with the field, not 500, for ?blockId=not-an-id on sprays and sampling plans', async () => {
    for (const path of ['/api/sprays?blockId=not-an-id', '/api/sampling-plans?blockId=not-an-id']) {
      const res = await manager.fetch(path);
      expect(res.status, path).toBe(422);
      const body = await res.json();
      expect(body.error.code).toBe('invalid-input');
      expect(Object.keys(body.error.fields)).toEqual(['blockId']);
    }
  });

  it('answers 422 naming the path parameter for a path id that is not a UUID', async () => {
    const res = await manager.fetch('/api/tasks/12345');
    expect(res.status).toBe(422);
    expect(Object.keys((await res.json()).error.fields)).toEqual(['id']);
  });
});

describe('request bodies are bounded while they stream (finding 8)', () => {
  it('answers 413 to a body without Content-Length that passes the limit and never ends, on member routes', async () => {
    const block = await makeBlock(team.org.id);
    for (const path of ['/api/sync', '/api/invitations', `/api/blocks/${block.id}/layout?mode=preview`]) {
      const res = await raw({
        path,
        headers: { cookie: manager.cookieHeader, 'content-type': path.includes('layout') ? 'text/csv' : 'application/json' },
        stream: { bytes: 40 * 1024 * 1024, endless: true },
      });
      expect(res.status, path).toBe(413);
      // The answer came while the body was still being sent: nothing waited for its end.
      expect(res.json().error.code).toBe('payload-too-large');
    }
  });

  it('does the same on public routes', async () => {
    for (const path of ['/api/invitations/accept', '/api/notifications/unsubscribe']) {
      const res = await raw({ path, headers: { 'content-type': 'application/json' }, stream: { bytes: 40 * 1024 * 1024, endless: true } });
      expect(res.status, path).toBe(413);
      expect(res.json().error.code).toBe('payload-too-large');
    }
  });

  it('answers 413 to a 20 MB body that ends, with Content-Length or without', async () => {
    const big = Buffer.alloc(20 * 1024 * 1024, ' ');
    const declared = await raw({ path: '/api/sync', headers: { cookie: manager.cookieHeader, 'content-type': 'application/json' }, body: big });
    expect(declared.status).toBe(413);
    const streamed = await raw({
      path: '/api/sync',
      headers: { cookie: manager.cookieHeader, 'content-type': 'application/json' },
      stream: { bytes: big.length },
    });
    expect(streamed.status).toBe(413);
  });
});

describe('mail keeps what people wrote (finding 8)', () => {
  it("sends a comment with $', $& and $1 in it unchanged, in the text and the HTML part", async () => {
    const block = await makeBlock(team.org.id);
    const scout = new Client();
    await scout.signIn(team.scout.email, PASSWORD);
    const observationId = randomUUID();
    const synced = await scout.json('/api/sync', 'POST', {
      observations: [
        { id: observationId, blockId: block.id, row: 1, position: 2, kind: 'note', data: {}, note: 'Dollar test', observedAt: '2026-11-12T09:00:00Z' },
      ],
    });
    expect(synced.status).toBe(200);
    const words = `Budget $1 a vine; keep $' and $& and $$ as typed`;
    const res = await manager.json('/api/comments', 'POST', {
      subject: 'observation',
      subjectId: observationId,
      body: `@${team.advisor.email} ${words}\nsecond line`,
    });
    expect(res.status).toBe(201);
    const [mail] = await waitForMail(team.advisor.email, 1, 30_000);
    expect(mail!.text).toContain(words);
    // In the HTML part only & is escaped; the line break becomes <br>; nothing is repeated or lost.
    const html = words.replace(/&/g, () => '&amp;');
    expect(mail!.html).toContain(`${html}<br>second line`);
    expect(mail!.html.split(html)).toHaveLength(2);
    expect(mail!.html).toContain('Choose which mails you get');
    expect(mail!.html.trim().endsWith('</div>')).toBe(true);
  });
});

describe('invitations are limited per manager and revocable (finding 8)', () => {
  it('lets a manager send 20 invitations in 24 hours; the 21st is refused with 429 and Retry-After, stores and sends nothing', async () => {
    const t = await makeTeam();
    const m = new Client();
    await m.signIn(t.manager.email, PASSWORD);
    for (let i = 0; i < 20; i++) expect((await m.json('/api/invitations', 'POST', { email: uniqueEmail(`batch${i}`), role: 'scout' })).status).toBe(201);
    const email = uniqueEmail('one-too-many');
    const refused = await m.json('/api/invitations', 'POST', { email, role: 'scout' });
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await refused.json()).error.code).toBe('rate-limited');
    expect(await invitationsTo(email)).toBe(0);
    // Revoking does not give the allowance back.
    const open = (await (await m.fetch('/api/invitations')).json()).invitations as { id: string }[];
    expect((await m.fetch(`/api/invitations/${open[0]!.id}`, { method: 'DELETE' })).status).toBe(200);
    expect((await m.json('/api/invitations', 'POST', { email, role: 'scout' })).status).toBe(429);
    // It is a rolling window: once the oldest is a day old there is room for one more.
    const [oldest] = await testDb()('invitations').where({ invited_by: t.manager.id }).orderBy('created_at').limit(1);
    await testDb()('invitations')
      .where({ id: oldest.id })
      .update({ created_at: new Date(Date.now() - 25 * 3600 * 1000) });
    expect((await m.json('/api/invitations', 'POST', { email, role: 'scout' })).status).toBe(201);
    // The limit is the manager's own: another manager of the same organisation still invites.
    const second = await makeMember(t.org.id, 'manager');
    const m2 = new Client();
    await m2.signIn(second.email, PASSWORD);
    expect((await m2.json('/api/invitations', 'POST', { email: uniqueEmail('second-manager'), role: 'scout' })).status).toBe(201);
  });

  it('lets a manager revoke a pending invitation; its link then answers 410 and signs nobody up', async () => {
    const email = uniqueEmail('revoked');
    const created = await manager.json('/api/invitations', 'POST', { email, role: 'advisor' });
    const { invitation } = await created.json();
    const token = tokenFrom(firstLink((await waitForMail(email))[0]!, '/invite/'));

    const scout = new Client();
    await scout.signIn(team.scout.email, PASSWORD);
    expect((await scout.fetch(`/api/invitations/${invitation.id}`, { method: 'DELETE' })).status).toBe(403);
    const stranger = await makeTeam();
    const strangerClient = new Client();
    await strangerClient.signIn(stranger.manager.email, PASSWORD);
    expect((await strangerClient.fetch(`/api/invitations/${invitation.id}`, { method: 'DELETE' })).status).toBe(404);

    const revoked = await manager.fetch(`/api/invitations/${invitation.id}`, { method: 'DELETE' });
    expect(revoked.status).toBe(200);
    expect((await revoked.json()).invitation).toMatchObject({ id: invitation.id, email });
    expect((await manager.fetch(`/api/invitations/${invitation.id}`, { method: 'DELETE' })).status).toBe(404);
    const open = (await (await manager.fetch('/api/invitations')).json()).invitations as { id: string }[];
    expect(open.map((i) => i.id)).not.toContain(invitation.id);

    const accept = await new Client().json('/api/invitations/accept', 'POST', { token, name: 'Too Late', password: 'a long password' });
    expect(accept.status).toBe(410);
    expect((await accept.json()).error.message).toMatch(/withdrawn/);
    expect(await testDb()('users').where({ email }).first()).toBeUndefined();
    const page = await new Client().fetch(`/invite/${token}`);
    expect(await page.text()).toMatch(/withdrawn/);
  });

  it('refuses to revoke an invitation that was already accepted (409)', async () => {
    const email = uniqueEmail('accepted');
    const { invitation } = await (await manager.json('/api/invitations', 'POST', { email, role: 'pruner' })).json();
    const token = tokenFrom(firstLink((await waitForMail(email))[0]!, '/invite/'));
    expect((await new Client().json('/api/invitations/accept', 'POST', { token, name: 'P', password: 'a long password' })).status).toBe(200);
    const res = await manager.fetch(`/api/invitations/${invitation.id}`, { method: 'DELETE' });
    expect(res.status).toBe(409);
    expect(
      await testDb()('memberships')
        .where({ organisation_id: team.org.id })
        .join('users', 'users.id', 'memberships.user_id')
        .where('users.email', email)
        .first(),
    ).toBeDefined();
  });
});

describe('security headers on API answers', () => {
  it('puts nosniff, no framing and a closed CSP on JSON answers, which the proxy no longer serves', async () => {
    const res = await manager.fetch('/api/me');
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(res.headers.get('x-frame-options')).toBe('DENY');
    expect(res.headers.get('content-security-policy')).toBe("default-src 'none'; frame-ancestors 'none'");
    // next-auth's routes still pass the proxy, with the pages' headers.
    const auth = await new Client().fetch('/api/auth/csrf');
    expect(auth.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
    expect(auth.headers.get('x-content-type-options')).toBe('nosniff');
  });
});
