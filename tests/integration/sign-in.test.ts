import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeTeam, PASSWORD } from '../helpers/fixtures';
import { Client } from '../helpers/http';
import { resetClientLimits } from '../helpers/limits';
import { firstLink, waitForMail } from '../helpers/mail';

beforeAll(resetClientLimits);
afterAll(async () => {
  await resetClientLimits();
  await closeTestDb();
});

describe('sign-in', () => {
  it('signs a member in with the right password and answers /api/me with their role', async () => {
    const { org, scout } = await makeTeam();
    const client = new Client();
    const res = await client.signIn(scout.email, PASSWORD);
    expect(res.status).toBe(200);
    expect(((await res.json()) as { url: string }).url).not.toContain('error=');
    expect(client.signedIn).toBe(true);

    const me = await client.fetch('/api/me');
    expect(me.status).toBe(200);
    const body = await me.json();
    expect(body).toMatchObject({ role: 'scout', organisation: { id: org.id }, user: { email: scout.email } });
  });

  it('refuses a wrong password without a session', async () => {
    const { manager } = await makeTeam();
    const client = new Client();
    const res = await client.signIn(manager.email, 'not the password');
    expect(res.status).toBe(401);
    const body = (await res.json()) as { url: string };
    expect(body.url).toContain('error=CredentialsSignin');
    expect(client.signedIn).toBe(false);
    expect((await client.fetch('/api/me')).status).toBe(401);
  });

  it('sends an e-mail sign-in link through SMTP that signs the person in once', async () => {
    const { pruner } = await makeTeam();
    const client = new Client();
    const csrfToken = await client.csrf();
    const res = await client.postForm('/api/auth/signin/email', { email: pruner.email, csrfToken, json: 'true', callbackUrl: '/' });
    expect(res.status).toBe(200);

    const [mail] = await waitForMail(pruner.email);
    expect(mail!.subject).toBe('Your Vineward sign-in link');
    const link = firstLink(mail!, '/api/auth/callback/email');

    const fresh = new Client();
    const callback = await fresh.fetch(new URL(link).pathname + new URL(link).search);
    expect(callback.status).toBe(302);
    expect(fresh.signedIn).toBe(true);
    expect(((await (await fresh.fetch('/api/me')).json()) as { role: string }).role).toBe('pruner');

    const again = new Client();
    const reused = await again.fetch(new URL(link).pathname + new URL(link).search);
    expect(reused.headers.get('location')).toContain('error=Verification');
    expect(again.signedIn).toBe(false);
  });

  it('sends no link to an address that has no account, but answers the same way', async () => {
    const client = new Client();
    const csrfToken = await client.csrf();
    const stranger = `nobody-${Date.now()}@example.com`;
    const res = await client.postForm('/api/auth/signin/email', { email: stranger, csrfToken, json: 'true', callbackUrl: '/' });
    expect(res.status).toBe(200);
    // The same "check your e-mail" step a member gets: next-auth's verify-request, which leads to our page.
    const url = new URL(((await res.json()) as { url: string }).url);
    expect(url.pathname).toBe('/api/auth/verify-request');
    expect((await client.fetch(url.pathname + url.search)).headers.get('location')).toContain('/signin/check-email');
    await new Promise((r) => setTimeout(r, 500));
    const { mailsTo } = await import('../helpers/mail');
    expect(await mailsTo(stranger)).toHaveLength(0);
  });

  it('answers 429 with a clear message after ten failed attempts on one account', async () => {
    const { advisor } = await makeTeam();
    const client = new Client();
    for (let i = 0; i < 10; i++) {
      const res = await client.signIn(advisor.email, `wrong-${i}`);
      expect(res.status).toBe(401);
    }
    const blocked = await client.signIn(advisor.email, PASSWORD);
    expect(blocked.status).toBe(429);
    expect(blocked.headers.get('retry-after')).toMatch(/^\d+$/);
    const body = (await blocked.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('rate-limited');
    expect(body.error.message).toMatch(/Too many failed sign-in attempts/);
    expect(client.signedIn).toBe(false);
  });
});
