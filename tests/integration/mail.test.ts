import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';
import { firstLink, mailsTo, waitForMail } from '../helpers/mail';

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let block: { id: string };
const as: Record<'manager' | 'scout' | 'pruner' | 'advisor', Client> = {} as never;

const inbox = () => process.env.SMTP_INBOX_URL!;
const smtp = async (action: 'pause' | 'resume') => expect((await fetch(`${inbox()}/api/${action}`, { method: 'POST' })).status).toBe(204);

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 8 });
  for (const role of ['manager', 'scout', 'pruner', 'advisor'] as const) {
    as[role] = new Client();
    await as[role].signIn(team[role].email, PASSWORD);
  }
});

afterAll(async () => {
  // Whatever happened above, later test files need a mail server.
  await fetch(`${inbox()}/api/resume`, { method: 'POST' });
  await closeTestDb();
});

async function until<T>(what: string, read: () => Promise<T>, ok: (value: T) => boolean, timeoutMs = 20_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (ok(value)) return value;
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}; last: ${JSON.stringify(value)}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

describe('the mail outbox', () => {
  it('keeps mail while the mail server is down, retries with back-off, and sends each mail once when it is back', async () => {
    const observationId = randomUUID();
    await as.scout.json('/api/sync', 'POST', {
      observations: [
        { id: observationId, blockId: block.id, row: 1, position: 3, kind: 'note', data: {}, note: 'Odd growth', observedAt: '2026-11-10T09:00:00Z' },
      ],
    });
    await smtp('pause');
    try {
      const res = await as.advisor.json('/api/comments', 'POST', {
        subject: 'observation',
        subjectId: observationId,
        body: `@${team.pruner.email} have a look`,
      });
      // The request does not wait for the mail server.
      expect(res.status).toBe(201);
      const { comment } = await res.json();
      const row = () =>
        testDb()('mail_outbox')
          .where({ dedupe_key: `comment:${comment.id}:${team.pruner.id}` })
          .first();
      const failed = await until('a failed attempt', row, (r) => r?.attempts >= 1 && r?.status === 'queued');
      expect(failed.last_error).toMatch(/ECONNREFUSED|connect/i);
      expect(new Date(failed.next_attempt_at).getTime()).toBeGreaterThan(Date.now());
      expect(await mailsTo(team.pruner.email)).toHaveLength(0);
    } finally {
      await smtp('resume');
    }
    const [mail] = await waitForMail(team.pruner.email, 1, 30_000);
    const stored = await until(
      'the row marked sent',
      () => testDb()('mail_outbox').where({ user_id: team.pruner.id, kind: 'mention' }).first(),
      (r) => r?.status === 'sent',
    );
    expect(stored.attempts).toBeGreaterThanOrEqual(2);
    expect((mail as unknown as { messageId: string }).messageId).toBe(`<${stored.id}@localhost>`);
    // Several polls later there is still exactly one copy.
    await new Promise((r) => setTimeout(r, 5000));
    expect(await mailsTo(team.pruner.email)).toHaveLength(1);
    expect((await mailsTo(team.scout.email)).filter((m) => m.text.includes('have a look'))).toHaveLength(1);
  });

  it('adds a notification once however often it is queued (one row per dedupe key)', async () => {
    const before = await testDb()('mail_outbox').count<{ count: string }[]>();
    const key = `comment:${randomUUID()}:${team.manager.id}`;
    const row = { user_id: team.manager.id, to_email: team.manager.email, kind: 'comment', dedupe_key: key, subject: 'Twice?', text_body: 'x', html_body: 'x' };
    await testDb()('mail_outbox').insert(row).onConflict('dedupe_key').ignore();
    await testDb()('mail_outbox').insert(row).onConflict('dedupe_key').ignore();
    const after = await testDb()('mail_outbox').count<{ count: string }[]>();
    expect(Number(after[0]!.count) - Number(before[0]!.count)).toBe(1);
    await waitForMail(team.manager.email, 1);
    await new Promise((r) => setTimeout(r, 3000));
    expect((await mailsTo(team.manager.email)).filter((m) => m.subject === 'Twice?')).toHaveLength(1);
  });
});

describe('notification settings and the daily digest', () => {
  it('keeps each person’s choices, with every mail but the digest on at first', async () => {
    const fresh = await (await as.advisor.fetch('/api/notifications/preferences')).json();
    expect(fresh.preferences).toEqual({ assignment: true, comment: true, mention: true, overdue: true, digest: false });
    const bad = await as.advisor.json('/api/notifications/preferences', 'PUT', { assignment: 'yes' });
    expect(bad.status).toBe(422);
    expect(Object.keys((await bad.json()).error.fields).sort()).toEqual(['assignment', 'comment', 'digest', 'mention', 'overdue']);
    expect((await new Client().fetch('/api/notifications/preferences')).status).toBe(401);
  });

  it('sends a digest to a person who chose one, with a link back and an unsubscribe link that works without signing in', async () => {
    const flagId = randomUUID();
    await as.scout.json('/api/sync/flags', 'POST', {
      flags: [{ id: flagId, blockId: block.id, row: 2, position: 2, reason: 'replant', note: '', flaggedAt: '2026-11-20T08:00:00Z' }],
    });
    const due = new Date(Date.now() + 5 * 24 * 3600 * 1000).toISOString().slice(0, 10);
    await as.manager.json('/api/tasks', 'POST', { flagIds: [flagId], assigneeId: team.pruner.id, dueOn: due, title: 'Replant the gap' });

    const res = await as.pruner.json('/api/notifications/preferences', 'PUT', { assignment: true, comment: true, mention: true, overdue: true, digest: true });
    expect((await res.json()).preferences.digest).toBe(true);
    const digest = await until(
      'the digest',
      async () => (await mailsTo(team.pruner.email)).filter((m) => m.subject.startsWith('Your Vineward digest')),
      (m) => m.length > 0,
    );
    expect(digest).toHaveLength(1);
    expect(digest[0]!.text).toContain('Replant the gap');
    expect(digest[0]!.text).toContain('/tasks');
    const unsubscribe = firstLink(digest[0]!, '/unsubscribe');
    const token = new URL(unsubscribe).searchParams.get('token')!;

    expect((await new Client().json('/api/notifications/unsubscribe', 'POST', { token: `${token.slice(0, -2)}xx` })).status).toBe(404);
    const page = await new Client().fetch(new URL(unsubscribe).pathname + new URL(unsubscribe).search);
    expect(page.status).toBe(200);
    const done = await new Client().json('/api/notifications/unsubscribe', 'POST', { token });
    expect(done.status).toBe(200);
    expect((await (await as.pruner.fetch('/api/notifications/preferences')).json()).preferences).toMatchObject({ digest: false, assignment: true });
    // Turning it on again the same day does not send that day's digest twice.
    await as.pruner.json('/api/notifications/preferences', 'PUT', { assignment: true, comment: true, mention: true, overdue: true, digest: true });
    await new Promise((r) => setTimeout(r, 4000));
    expect((await mailsTo(team.pruner.email)).filter((m) => m.subject.startsWith('Your Vineward digest'))).toHaveLength(1);
  });
});
