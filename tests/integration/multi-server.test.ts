/**
 * Two app servers on one PostgreSQL, one S3 fake and one SMTP fake, as behind a load balancer: the
 * suite's server and a second one of this file's own on the slot's spare port. A device's batches
 * go to either; one server dies mid-batch; mail is sent by both servers' workers; sign-in limits and
 * sessions hold across both.
 */
import { randomUUID } from 'node:crypto';
import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { startSpareApp } from '../helpers/faults';
import { APP_URL, Client } from '../helpers/http';
import { resetClientLimits } from '../helpers/limits';
import { mailsTo } from '../helpers/mail';

let team: Awaited<ReturnType<typeof makeTeam>>;
let block: { id: string };
let spare: { child: ChildProcess; url: string } | undefined;

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 10, vinesPerRow: 30 });
  spare = await startSpareApp();
});

afterAll(async () => {
  spare?.child.kill('SIGKILL');
  await resetClientLimits();
  await closeTestDb();
});

async function restartSpare() {
  spare?.child.kill('SIGKILL');
  spare = await startSpareApp();
  return spare;
}

const observation = (i: number, tag: string) => ({
  id: randomUUID(),
  blockId: block.id,
  row: 1 + (i % 10),
  position: 1 + (i % 30),
  kind: 'note',
  data: {},
  note: `${tag} ${i}`,
  observedAt: new Date(Date.now() - i * 1000).toISOString(),
});

describe('two app servers on one database, storage and mail server', () => {
  it('takes a device’s batches on either server, and a batch cut off by a dying server is stored once on retry', async () => {
    const onMain = new Client();
    const onSpare = new Client(spare!.url);
    await onMain.signIn(team.scout.email, PASSWORD);
    await onSpare.signIn(team.scout.email, PASSWORD);
    const batches = Array.from({ length: 6 }, (_, b) => Array.from({ length: 150 }, (_, i) => observation(b * 150 + i, `batch ${b}`)));

    for (const [b, batch] of batches.entries()) {
      const client = b % 2 === 0 ? onMain : onSpare;
      if (b === 3) {
        // The spare server dies while it works on this batch; the device never sees its answer.
        const sent = onSpare.json('/api/sync', 'POST', { observations: batch }).then(
          (r) => r.status,
          () => 0,
        );
        await new Promise((r) => setTimeout(r, 30));
        spare!.child.kill('SIGKILL');
        expect([0, 200]).toContain(await sent);
        // The device sends the batch again; the load balancer now sends it to the server still up.
        const retry = await onMain.json('/api/sync', 'POST', { observations: batch });
        expect(retry.status).toBe(200);
        const { results } = (await retry.json()) as { results: { id: string; status: string }[] };
        expect(results.map((r) => r.id)).toEqual(batch.map((o) => o.id));
        for (const r of results) expect(['created', 'duplicate']).toContain(r.status);
        await restartSpare();
        await onSpare.signIn(team.scout.email, PASSWORD);
        continue;
      }
      const res = await client.json('/api/sync', 'POST', { observations: batch });
      expect(res.status).toBe(200);
      const { results } = (await res.json()) as { results: { status: string }[] };
      expect(results.every((r) => r.status === 'created')).toBe(true);
    }

    // Every batch once more, each to the other server than before: all duplicates, nothing new.
    for (const [b, batch] of batches.entries()) {
      const res = await (b % 2 === 0 ? onSpare : onMain).json('/api/sync', 'POST', { observations: batch });
      const { results } = (await res.json()) as { results: { status: string }[] };
      expect(results.every((r) => r.status === 'duplicate')).toBe(true);
    }
    const ids = batches.flat().map((o) => o.id);
    const stored = await testDb()('observations').whereIn('id', ids).select('id', 'note');
    expect(stored).toHaveLength(ids.length);
    expect(new Set(stored.map((s) => s.id)).size).toBe(ids.length);
    const notes = new Map(batches.flat().map((o) => [o.id, o.note]));
    for (const s of stored) expect(s.note).toBe(notes.get(s.id));
  });

  it('sends each mail once, though the mail worker runs on both servers', async () => {
    const managers = [new Client(), new Client(spare!.url)];
    for (const m of managers) await m.signIn(team.manager.email, PASSWORD);
    const scout = new Client();
    await scout.signIn(team.scout.email, PASSWORD);
    // Assignment mail goes through the outbox, which both servers' workers drain.
    const tasks = 8;
    for (let i = 0; i < tasks; i++) {
      const flag = { id: randomUUID(), blockId: block.id, row: 1 + i, position: 5, reason: 'retrain', note: '', flaggedAt: '2026-11-20T08:00:00Z' };
      expect((await (await scout.json('/api/sync/flags', 'POST', { flags: [flag] })).json()).results[0].status).toBe('created');
      const due = new Date(Date.now() + 7 * 86_400_000).toISOString().slice(0, 10);
      const res = await managers[i % 2]!.json('/api/tasks', 'POST', { flagIds: [flag.id], assigneeId: team.pruner.id, dueOn: due });
      expect(res.status, await res.clone().text()).toBe(201);
    }
    const queued = () => testDb()('mail_outbox').where({ user_id: team.pruner.id, kind: 'assignment' }).select('id', 'status');
    const deadline = Date.now() + 30_000;
    while ((await queued()).some((r) => r.status !== 'sent') && Date.now() < deadline) await new Promise((r) => setTimeout(r, 250));
    const rows = await queued();
    expect(rows).toHaveLength(tasks);
    expect(rows.every((r) => r.status === 'sent')).toBe(true);
    // Several more polls of both workers (MAIL_POLL_MS, 2 s by default): a second send would show now.
    await new Promise((r) => setTimeout(r, 5000));
    const mails = (await mailsTo(team.pruner.email)) as (Awaited<ReturnType<typeof mailsTo>>[number] & { messageId: string })[];
    expect(mails).toHaveLength(tasks);
    // Each outbox row's Message-ID (made from its id) arrived exactly once.
    expect(new Set(mails.map((m) => m.messageId.replace(/^<|@.*$/g, '')))).toEqual(new Set(rows.map((r) => r.id)));
  });

  it('counts wrong passwords split across both servers against one limit', async () => {
    await resetClientLimits();
    const { advisor } = await makeTeam();
    const clients = [new Client(), new Client(spare!.url)];
    for (let i = 0; i < 10; i++) expect((await clients[i % 2]!.signIn(advisor.email, `wrong-${i}`)).status).toBe(401);
    // The eleventh guess is refused on either server, and so is the right password for now.
    expect((await clients[0]!.signIn(advisor.email, 'wrong-10')).status).toBe(429);
    expect((await clients[1]!.signIn(advisor.email, 'wrong-11')).status).toBe(429);
    expect((await new Client(spare!.url).signIn(advisor.email, PASSWORD)).status).toBe(429);
    expect((await new Client().signIn(advisor.email, PASSWORD)).status).toBe(429);
    await resetClientLimits();
  });

  it('takes a session made on one server on the other', async () => {
    const onSpare = new Client(spare!.url);
    expect((await onSpare.signIn(team.manager.email, PASSWORD)).status).toBe(200);
    const onMain = new Client();
    expect((await onMain.signIn(team.scout.email, PASSWORD)).status).toBe(200);
    const path = `/api/grid/${block.id}`;
    const fromSpareOnMain = await fetch(new URL(path, APP_URL), { headers: { cookie: onSpare.cookieHeader }, redirect: 'manual' });
    expect(fromSpareOnMain.status).toBe(200);
    const fromMainOnSpare = await fetch(new URL(path, spare!.url), { headers: { cookie: onMain.cookieHeader }, redirect: 'manual' });
    expect(fromMainOnSpare.status).toBe(200);
    // And without a session, neither server answers with data.
    expect((await fetch(new URL(path, spare!.url), { redirect: 'manual' })).status).toBe(401);
    expect((await fetch(new URL(path, APP_URL), { redirect: 'manual' })).status).toBe(401);
  });
});
