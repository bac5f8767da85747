import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';
import { mailsTo, waitForMail } from '../helpers/mail';

afterAll(closeTestDb);

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let other: Team;
let manager: Client;

/** A row as the worker leaves it: refused for good, or interrupted mid-send. */
async function leftBehind(t: Team, status: 'failed' | 'uncertain', subject: string) {
  const id = randomUUID();
  await testDb()('mail_outbox').insert({
    id,
    organisation_id: t.org.id,
    user_id: t.scout.id,
    to_email: t.scout.email,
    kind: 'comment',
    dedupe_key: `test:${id}`,
    subject,
    text_body: `${subject}\n`,
    html_body: `<p>${subject}</p>`,
    status,
    attempts: status === 'failed' ? 5 : 1,
    last_error: status === 'failed' ? '550 mailbox unavailable' : 'The worker stopped during the SMTP call; not resent, to never send twice.',
  });
  return id;
}

beforeAll(async () => {
  [team, other] = await Promise.all([makeTeam(), makeTeam()]);
  manager = new Client();
  await manager.signIn(team.manager.email, PASSWORD);
});

describe('mail that failed or may not have arrived', () => {
  it('is listed for the organisation’s managers only, and only their organisation’s', async () => {
    const failed = await leftBehind(team, 'failed', 'Refused mail');
    const uncertain = await leftBehind(team, 'uncertain', 'Interrupted mail');
    const foreign = await leftBehind(other, 'failed', 'Not yours');

    const res = await manager.fetch('/api/notifications/undelivered');
    expect(res.status).toBe(200);
    const { mail } = await res.json();
    expect(mail.map((m: { id: string }) => m.id).sort()).toEqual([failed, uncertain].sort());
    expect(mail.find((m: { id: string }) => m.id === failed)).toMatchObject({
      status: 'failed',
      attempts: 5,
      lastError: '550 mailbox unavailable',
      toEmail: team.scout.email,
    });

    const scout = new Client();
    await scout.signIn(team.scout.email, PASSWORD);
    expect((await scout.fetch('/api/notifications/undelivered')).status).toBe(403);
    expect((await scout.json(`/api/notifications/undelivered/${failed}`, 'POST', { action: 'resend' })).status).toBe(403);
    expect((await new Client().fetch('/api/notifications/undelivered')).status).toBe(401);
    // Another organisation's mail cannot be touched, even with its id.
    expect((await manager.json(`/api/notifications/undelivered/${foreign}`, 'POST', { action: 'dismiss' })).status).toBe(404);
    expect((await testDb()('mail_outbox').where({ id: foreign }).first('status')).status).toBe('failed');
  });

  it('sends again once when asked, and leaves the list', async () => {
    const id = await leftBehind(team, 'uncertain', `Second try ${randomUUID().slice(0, 6)}`);
    const subject = (await testDb()('mail_outbox').where({ id }).first('subject')).subject as string;
    const res = await manager.json(`/api/notifications/undelivered/${id}`, 'POST', { action: 'resend' });
    expect(res.status).toBe(200);
    const mails = await waitForMail(team.scout.email, 1, 20_000);
    expect(mails.filter((m) => m.subject === subject)).toHaveLength(1);
    const row = await testDb()('mail_outbox').where({ id }).first('status', 'attempts');
    expect(row).toMatchObject({ status: 'sent', attempts: 1 });
    const { mail } = await (await manager.fetch('/api/notifications/undelivered')).json();
    expect(mail.map((m: { id: string }) => m.id)).not.toContain(id);
    // Asking twice does not send twice: the row is no longer undelivered.
    expect((await manager.json(`/api/notifications/undelivered/${id}`, 'POST', { action: 'resend' })).status).toBe(404);
    expect((await mailsTo(team.scout.email)).filter((m) => m.subject === subject)).toHaveLength(1);
  });

  it('is dismissed for good, noting who dismissed it, and answers clearly to a bad request', async () => {
    const id = await leftBehind(team, 'failed', 'Let it go');
    const bad = await manager.json(`/api/notifications/undelivered/${id}`, 'POST', { action: 'shred' });
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.fields.action).toEqual(['Must be resend or dismiss']);
    expect((await manager.json('/api/notifications/undelivered/not-an-id', 'POST', { action: 'dismiss' })).status).toBe(422);

    expect((await manager.json(`/api/notifications/undelivered/${id}`, 'POST', { action: 'dismiss' })).status).toBe(200);
    const row = await testDb()('mail_outbox').where({ id }).first('status', 'dismissed_by');
    expect(row).toEqual({ status: 'dismissed', dismissed_by: team.manager.id });
    const { mail } = await (await manager.fetch('/api/notifications/undelivered')).json();
    expect(mail.map((m: { id: string }) => m.id)).not.toContain(id);
  });
});
