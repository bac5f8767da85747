/**
 * PostgreSQL stopped and started under a syncing device. Every answer meanwhile is 200 or a quick
 * 503 with Retry-After (never a 500, never a hang), and after the restart the device's retried
 * batch is stored exactly once. afterAll always starts PostgreSQL again.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { startPostgres, stopPostgres, timed } from '../helpers/faults';
import { Client } from '../helpers/http';

let team: Awaited<ReturnType<typeof makeTeam>>;
let block: { id: string };
let scout: Client;
let down = false;

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 10, vinesPerRow: 20 });
  scout = new Client();
  await scout.signIn(team.scout.email, PASSWORD);
});

afterAll(async () => {
  if (down) await startPostgres();
  await closeTestDb();
});

const batch = (n: number) =>
  Array.from({ length: n }, (_, i) => ({
    id: randomUUID(),
    blockId: block.id,
    row: 1 + (i % 10),
    position: 1 + (i % 20),
    kind: 'note',
    data: {},
    note: `restart ${i}`,
    observedAt: new Date(Date.now() - i * 1000).toISOString(),
  }));

const postSync = (observations: unknown[]) => (signal: AbortSignal) =>
  scout.fetch('/api/sync', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ observations }), signal });

describe('PostgreSQL restarted mid-sync', () => {
  it('answers 503 with Retry-After while it is down and stores the retried batch exactly once after', async () => {
    const observations = batch(200);
    const answers: { status: number; ms: number; retryAfter: string | null; code?: string }[] = [];
    let final: { results: { id: string; status: string }[] } | undefined;

    // The device: sends the batch, and on anything but a 200 waits a moment and sends it again.
    const device = (async () => {
      const giveUp = Date.now() + 45_000;
      while (Date.now() < giveUp) {
        const res = await timed(postSync(observations), 15_000);
        answers.push({
          status: res.status,
          ms: res.ms,
          retryAfter: res.headers.get('retry-after'),
          code: res.status === 503 ? res.json().error.code : undefined,
        });
        if (res.status === 200) {
          final = res.json();
          return;
        }
        await new Promise((r) => setTimeout(r, 300));
      }
    })();

    await new Promise((r) => setTimeout(r, 30)); // the first send is in flight
    down = true;
    await stopPostgres();
    // Whether or not the first send was cut, a batch sent while the database is down is answered 503.
    const second = batch(200);
    const whileDown = await timed(postSync(second));
    const grid = await timed((signal) => scout.fetch(`/api/grid/${block.id}`, { signal }));
    const health = await timed((signal) => scout.fetch('/api/health', { signal }));
    await new Promise((r) => setTimeout(r, 1000));
    await startPostgres();
    down = false;
    await device;

    expect(grid.status, grid.text).toBe(503);
    expect(grid.ms).toBeLessThan(7000);
    expect(grid.headers.get('retry-after')).toBeTruthy();
    expect(grid.json().error.code).toBe('unavailable');
    expect(health.status).toBe(503);
    expect(health.json()).toMatchObject({ ok: false, database: false });

    expect(final, JSON.stringify(answers)).toBeDefined();
    for (const a of answers.slice(0, -1)) {
      expect(a.status, JSON.stringify(answers)).toBe(503);
      expect(a.retryAfter).toBeTruthy();
      expect(a.ms).toBeLessThan(7000);
    }
    expect(whileDown.status, whileDown.text).toBe(503);
    expect(whileDown.headers.get('retry-after')).toBeTruthy();
    expect(whileDown.ms).toBeLessThan(7000);
    // The device sends the second batch again after the restart: stored once too.
    const retried = await timed(postSync(second));
    expect(retried.status).toBe(200);
    for (const r of retried.json().results) expect(['created', 'duplicate']).toContain(r.status);
    const storedSecond = await testDb()('observations')
      .whereIn(
        'id',
        second.map((o) => o.id),
      )
      .count<{ count: string }[]>();
    expect(Number(storedSecond[0]!.count)).toBe(200);
    const odd = final!.results.filter((r) => r.status !== 'created' && r.status !== 'duplicate');
    expect(odd, JSON.stringify(odd.slice(0, 3))).toEqual([]);
    const stored = await testDb()('observations')
      .whereIn(
        'id',
        observations.map((o) => o.id),
      )
      .count<{ count: string }[]>();
    expect(Number(stored[0]!.count)).toBe(200);

    // The pool recovered: the same server answers the grid again.
    expect((await scout.fetch(`/api/grid/${block.id}`)).status).toBe(200);
  });
});
