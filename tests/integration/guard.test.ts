import { encode } from 'next-auth/jwt';
import { afterAll, describe, expect, it } from 'vitest';
import type { Role } from '@/lib/roles';
import { closeTestDb, makeMember, makeOrganisation, makeTeam, PASSWORD } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

async function as(email: string) {
  const client = new Client();
  await client.signIn(email, PASSWORD);
  return client;
}

describe('the server-side guard', () => {
  it('answers 401 as JSON to a signed-out caller on every guarded route', async () => {
    const client = new Client();
    for (const [path, method] of [
      ['/api/me', 'GET'],
      ['/api/members', 'GET'],
      ['/api/invitations', 'GET'],
      ['/api/invitations', 'POST'],
      ['/api/organisations/current', 'PUT'],
    ] as const) {
      const res = await client.json(path, method, method === 'GET' ? undefined : {});
      expect(res.status, `${method} ${path}`).toBe(401);
      expect((await res.json()).error.code).toBe('unauthenticated');
    }
  });

  it('takes the session only from its own cookie, signed with the server secret and not expired', async () => {
    const team = await makeTeam();
    const signedIn = await as(team.scout.email);
    const name = 'next-auth.session-token';
    const token = signedIn.cookie(name)!;
    const secret = process.env.NEXTAUTH_SECRET!;
    const claims = { sub: team.scout.id, uid: team.scout.id, email: team.scout.email };
    const me = (headers: Record<string, string>) => fetch(new URL('/api/me', signedIn.base), { headers });

    expect((await me({ cookie: `${name}=${token}` })).status).toBe(200);
    // Made here with the server's secret: the control for the refusals below.
    expect((await me({ cookie: `${name}=${await encode({ token: claims, secret })}` })).status).toBe(200);
    expect((await me({ authorization: `Bearer ${token}` })).status).toBe(401);
    const flipped = token.slice(0, -3) + (token.at(-3) === 'A' ? 'B' : 'A') + token.slice(-2);
    expect((await me({ cookie: `${name}=${flipped}` })).status).toBe(401);
    expect((await me({ cookie: `${name}=${await encode({ token: claims, secret: 'another-secret-another-secret-00' })}` })).status).toBe(401);
    // Past next-auth's 15 s of clock tolerance.
    expect((await me({ cookie: `${name}=${await encode({ token: claims, secret, maxAge: -60 })}` })).status).toBe(401);
  });

  // "manage team, invitations": manager only (roles table in DESIGN.md).
  it.each<[Role, number]>([
    ['manager', 201],
    ['scout', 403],
    ['pruner', 403],
    ['advisor', 403],
  ])('lets a %s invite people: %i', async (role, status) => {
    const team = await makeTeam();
    const client = await as(team[role].email);
    const res = await client.json('/api/invitations', 'POST', { email: `x-${Date.now()}-${role}@example.com`, role: 'scout' });
    expect(res.status).toBe(status);
    if (status === 403) expect((await res.json()).error).toMatchObject({ code: 'forbidden' });
  });

  // "read grid, photo log, reports": every role.
  it.each<Role>(['manager', 'scout', 'pruner', 'advisor'])('lets a %s read the member list of their organisation', async (role) => {
    const team = await makeTeam();
    const client = await as(team[role].email);
    const res = await client.fetch('/api/members');
    expect(res.status).toBe(200);
    const { members } = await res.json();
    expect(members.map((m: { email: string }) => m.email).sort()).toEqual([team.manager, team.scout, team.pruner, team.advisor].map((u) => u.email).sort());
  });

  it('never shows one organisation the data of another, and refuses switching into it', async () => {
    const a = await makeTeam();
    const b = await makeTeam();
    const client = await as(a.manager.email);
    const members = (await (await client.fetch('/api/members')).json()).members as { email: string }[];
    expect(members.some((m) => m.email === b.manager.email)).toBe(false);

    const invites = await (await as(b.manager.email)).json('/api/invitations', 'POST', { email: `b-${Date.now()}@example.com`, role: 'scout' });
    expect(invites.status).toBe(201);
    const listed = (await (await client.fetch('/api/invitations')).json()).invitations as { email: string }[];
    expect(listed).toHaveLength(0);

    const res = await client.json('/api/organisations/current', 'PUT', { organisationId: b.org.id });
    expect(res.status).toBe(404);
    expect(((await (await client.fetch('/api/me')).json()) as { organisation: { id: string } }).organisation.id).toBe(a.org.id);
  });

  it('uses the role of the organisation a person switched to', async () => {
    const first = await makeOrganisation('Aardvark Test Estate');
    const second = await makeOrganisation('Zebra Test Estate');
    const person = await makeMember(first.id, 'manager');
    const { testDb } = await import('../helpers/fixtures');
    await testDb()('memberships').insert({ organisation_id: second.id, user_id: person.id, role: 'advisor' });
    const client = await as(person.email);

    expect((await (await client.fetch('/api/me')).json()).role).toBe('manager');
    expect((await client.json('/api/organisations/current', 'PUT', { organisationId: second.id })).status).toBe(200);
    expect((await (await client.fetch('/api/me')).json()).role).toBe('advisor');
    const res = await client.json('/api/invitations', 'POST', { email: `s-${Date.now()}@example.com`, role: 'scout' });
    expect(res.status).toBe(403);
  });

  it('puts security headers on every response', async () => {
    const res = await new Client().fetch('/signin');
    expect(res.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
    expect(res.headers.get('content-security-policy')).toContain(`connect-src 'self' ${new URL(process.env.S3_ENDPOINT!).origin}`);
    expect(res.headers.get('x-frame-options')).toBe('DENY');
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
  });
});
