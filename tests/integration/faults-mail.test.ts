/**
 * The mail server stalled: it accepts connections and never answers (SIGSTOP on the SMTP fake;
 * refused connections are covered in mail.test.ts). Requests that queue mail answer at once, the
 * outbox worker gives up on the attempt within its deadlines and retries later, and each mail
 * arrives once when the server answers again.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb, uniqueEmail } from '../helpers/fixtures';
import { resumeMail, stallMail, timed } from '../helpers/faults';
import { Client } from '../helpers/http';
import { mailsTo, waitForMail } from '../helpers/mail';

let team: Awaited<ReturnType<typeof makeTeam>>;
let block: { id: string };
const as: Record<'manager' | 'scout' | 'advisor', Client> = {} as never;

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 8 });
  for (const role of ['manager', 'scout', 'advisor'] as const) {
    as[role] = new Client();
    await as[role].signIn(team[role].email, PASSWORD);
  }
});

afterAll(async () => {
  resumeMail();
  await closeTestDb();
});

async function until<T>(what: string, read: () => Promise<T>, ok: (value: T) => boolean, timeoutMs: number) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (ok(value)) return value;
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}; last: ${JSON.stringify(value)}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe('a stalled mail server', () => {
  it('holds no request, lets the worker give up in time and retry, and delivers each mail once when it answers again', async () => {
    const observationId = randomUUID();
    await as.scout.json('/api/sync', 'POST', {
      observations: [
        { id: observationId, blockId: block.id, row: 1, position: 2, kind: 'note', data: {}, note: 'Bleeding cut', observedAt: '2026-11-12T09:00:00Z' },
      ],
    });
    stallMail();
    let queuedAt: number;
    let comment: Awaited<ReturnType<typeof timed>>;
    let invitation: Awaited<ReturnType<typeof timed>>;
    let failed: { attempts: number; status: string; last_error: string };
    let health: Awaited<ReturnType<typeof timed>>;
    try {
      comment = await timed((signal) =>
        as.advisor.fetch('/api/comments', {
          method: 'POST',
          signal,
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({ subject: 'observation', subjectId: observationId, body: `@${team.pruner.email} see the cut` }),
        }),
      );
      queuedAt = Date.now();
      health = await timed((signal) => as.scout.fetch('/api/health', { signal }));
      // An invitation sends its mail during the request: bounded by the SMTP deadlines, not hung.
      invitation = await timed(
        (signal) =>
          as.manager.fetch('/api/invitations', {
            method: 'POST',
            signal,
            headers: { 'content-type': 'application/json' },
            body: JSON.stringify({ email: uniqueEmail('stalled'), role: 'scout' }),
          }),
        20_000,
      );
      const id = comment.json().comment.id;
      failed = await until(
        'the worker to give up on the attempt',
        () =>
          testDb()('mail_outbox')
            .where({ dedupe_key: `comment:${id}:${team.pruner.id}` })
            .first(),
        (r) => r?.attempts >= 1 && r?.status === 'queued',
        15_000,
      );
    } finally {
      resumeMail();
    }
    expect(comment.status).toBe(201);
    expect(comment.ms).toBeLessThan(3000);
    // /api/health names the mail server as down, yet the server stays in rotation.
    expect(health!.status).toBe(200);
    expect(health!.json()).toEqual({ ok: false, database: true, storage: true, mail: false });
    expect(health!.ms).toBeLessThan(5000);
    expect(invitation.status, invitation.text).not.toBe(0);
    expect(invitation.ms).toBeLessThan(10_000);
    expect(failed.last_error).toMatch(/timeout|greeting/i);
    expect(Date.now() - queuedAt!).toBeLessThan(15_000);

    const [mail] = await waitForMail(team.pruner.email, 1, 45_000);
    expect(mail!.text).toContain('see the cut');
    const id = comment.json().comment.id;
    const sent = await until(
      'the row marked sent',
      () =>
        testDb()('mail_outbox')
          .where({ dedupe_key: `comment:${id}:${team.pruner.id}` })
          .first(),
      (r) => r?.status === 'sent',
      20_000,
    );
    expect(sent.attempts).toBeGreaterThanOrEqual(2);
    await new Promise((r) => setTimeout(r, 3000));
    expect((await mailsTo(team.pruner.email)).filter((m) => m.text.includes('see the cut'))).toHaveLength(1);
    expect(await testDb()('mail_outbox').where({ dedupe_key: `comment:${id}:${team.pruner.id}` })).toHaveLength(1);
  }, 60_000);

  it('refuses a sign-in link at once, alike for a member and a stranger, instead of promising a mail that cannot go', async () => {
    const ask = async (email: string) => {
      const client = new Client();
      const csrfToken = await client.csrf();
      const started = Date.now();
      const res = await client.postForm('/api/auth/signin/email', { email, csrfToken, json: 'true', callbackUrl: '/' });
      const url = new URL(((await res.json()) as { url: string }).url);
      return { error: url.searchParams.get('error'), path: url.pathname, ms: Date.now() - started };
    };
    stallMail();
    let member: Awaited<ReturnType<typeof ask>>;
    let stranger: Awaited<ReturnType<typeof ask>>;
    try {
      member = await ask(team.scout.email);
      stranger = await ask(uniqueEmail('nobody'));
    } finally {
      resumeMail();
    }
    // The same answer for both, so it says nothing of who has an account; bounded by the probe's deadline.
    expect(member).toMatchObject({ error: 'EmailSignin' });
    expect(stranger).toMatchObject({ error: 'EmailSignin', path: member.path });
    expect(member.ms).toBeLessThan(6_000);
    expect(stranger.ms).toBeLessThan(6_000);
    // With the mail server answering again, a link goes out as before.
    expect((await ask(team.scout.email)).error).toBeNull();
    const links = await until(
      'the sign-in link',
      async () => (await mailsTo(team.scout.email)).filter((m) => m.subject === 'Your Vineward sign-in link'),
      (m) => m.length > 0,
      20_000,
    );
    expect(links).toHaveLength(1);
  }, 60_000);
});
