import { afterAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeTeam, PASSWORD, testDb, uniqueEmail } from '../helpers/fixtures';
import { Client } from '../helpers/http';
import { firstLink, waitForMail } from '../helpers/mail';

afterAll(closeTestDb);

async function managerOf() {
  const team = await makeTeam();
  const client = new Client();
  await client.signIn(team.manager.email, PASSWORD);
  return { ...team, client };
}

const tokenFrom = (link: string) => new URL(link).pathname.split('/').pop()!;

describe('invitations', () => {
  it('a manager invites by e-mail; the link signs a new person up into that organisation with that role', async () => {
    const { org, client } = await managerOf();
    const email = uniqueEmail('newcomer');
    const res = await client.json('/api/invitations', 'POST', { email, role: 'scout' });
    expect(res.status).toBe(201);

    const [mail] = await waitForMail(email);
    expect(mail!.subject).toContain(org.name);
    const token = tokenFrom(firstLink(mail!, '/invite/'));

    const page = await new Client().fetch(`/invite/${token}`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain(`Join ${org.name}`);

    const newcomer = new Client();
    const accept = await newcomer.json('/api/invitations/accept', 'POST', { token, name: 'New Scout', password: 'a long password' });
    expect(accept.status).toBe(200);
    await newcomer.signIn(email, 'a long password');
    const me = await (await newcomer.fetch('/api/me')).json();
    expect(me).toMatchObject({ role: 'scout', organisation: { id: org.id } });
  });

  it('refuses a link that was already used, with a clear message', async () => {
    const { client } = await managerOf();
    const email = uniqueEmail('twice');
    await client.json('/api/invitations', 'POST', { email, role: 'pruner' });
    const token = tokenFrom(firstLink((await waitForMail(email))[0]!, '/invite/'));
    const first = await new Client().json('/api/invitations/accept', 'POST', { token, name: 'P', password: 'a long password' });
    expect(first.status).toBe(200);

    const second = await new Client().json('/api/invitations/accept', 'POST', { token, name: 'Q', password: 'another password' });
    expect(second.status).toBe(410);
    expect((await second.json()).error.message).toMatch(/already been used/);
  });

  it('refuses an expired link and creates nobody', async () => {
    const { client } = await managerOf();
    const email = uniqueEmail('late');
    await client.json('/api/invitations', 'POST', { email, role: 'advisor' });
    const token = tokenFrom(firstLink((await waitForMail(email))[0]!, '/invite/'));
    await testDb()('invitations')
      .where({ email })
      .update({ expires_at: new Date(Date.now() - 1000) });

    const res = await new Client().json('/api/invitations/accept', 'POST', { token, name: 'L', password: 'a long password' });
    expect(res.status).toBe(410);
    expect((await res.json()).error.message).toMatch(/expired/);
    expect(await testDb()('users').where({ email }).first()).toBeUndefined();
  });

  it('refuses an unknown token with 404 and bad fields with 422 field by field', async () => {
    const unknown = await new Client().json('/api/invitations/accept', 'POST', { token: 'x'.repeat(43) });
    expect(unknown.status).toBe(404);

    const { client } = await managerOf();
    const bad = await client.json('/api/invitations', 'POST', { email: 'not-an-address', role: 'owner' });
    expect(bad.status).toBe(422);
    const body = await bad.json();
    expect(Object.keys(body.error.fields).sort()).toEqual(['email', 'role']);
  });
});
