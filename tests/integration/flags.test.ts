import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { unpackRow } from '@/lib/grid/cells';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let block: { id: string };
const as: Record<'manager' | 'scout' | 'pruner' | 'advisor', Client> = {} as never;

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 4, vinesPerRow: 12 });
  for (const role of ['manager', 'scout', 'pruner', 'advisor'] as const) {
    as[role] = new Client();
    await as[role].signIn(team[role].email, PASSWORD);
  }
});

const flag = (over: Record<string, unknown> = {}): Record<string, unknown> & { id: string } => ({
  id: randomUUID(),
  blockId: block.id,
  row: 2,
  position: 5,
  reason: 'trunk-renewal',
  note: 'Split trunk, keep the sucker',
  flaggedAt: '2026-11-03T09:15:00+13:00',
  ...over,
});

const sync = (client: Client, flags: unknown[]) => client.json('/api/sync/flags', 'POST', { flags });

async function results(client: Client, flags: unknown[]) {
  const res = await sync(client, flags);
  expect(res.status, await res.clone().text()).toBe(200);
  return (await res.json()).results as { id: string; status: string; errors?: { field: string; message: string }[] }[];
}

describe('roles table: flag a vine for extra care', () => {
  it.each([
    ['manager', 200],
    ['scout', 200],
    ['pruner', 200],
    ['advisor', 403],
  ] as const)('answers %s with %i', async (role, status) => {
    const f = flag();
    const res = await sync(as[role], [f]);
    expect(res.status).toBe(status);
    expect(await testDb()('flags').where({ id: f.id })).toHaveLength(status === 200 ? 1 : 0);
  });

  it('answers 401 to a signed-out device and stores nothing', async () => {
    const f = flag();
    expect((await sync(new Client(), [f])).status).toBe(401);
    expect(await testDb()('flags').where({ id: f.id })).toHaveLength(0);
  });
});

describe('POST /api/sync/flags', () => {
  it('stores a flag once with who flagged it, and answers a retry as "duplicate"', async () => {
    const f = flag();
    expect(await results(as.pruner, [f])).toEqual([{ id: f.id, status: 'created' }]);
    // The same record with its keys in another order and the time in another zone.
    const retry = { ...f, flaggedAt: '2026-11-02T20:15:00Z', reason: f.reason };
    expect(await results(as.pruner, [retry])).toEqual([{ id: f.id, status: 'duplicate' }]);
    const stored = await testDb()('flags').where({ id: f.id });
    expect(stored).toHaveLength(1);
    expect(stored[0]).toMatchObject({ organisation_id: team.org.id, flagged_by: team.pruner.id, row_number: 2, position: 5, to_position: 5, status: 'open' });
  });

  it('reports another payload under a stored id as "conflict" and keeps the stored flag', async () => {
    const f = flag();
    await results(as.scout, [f]);
    expect(await results(as.scout, [{ ...f, reason: 'replant' }])).toEqual([{ id: f.id, status: 'conflict' }]);
    expect((await testDb()('flags').where({ id: f.id }).first()).reason).toBe('trunk-renewal');
  });

  it('flags a run of vines in one row as one record', async () => {
    const f = flag({ row: 3, position: 4, toPosition: 9, reason: 'retrain', note: '' });
    expect(await results(as.pruner, [f])).toEqual([{ id: f.id, status: 'created' }]);
    expect(await testDb()('flags').where({ id: f.id }).first()).toMatchObject({ row_number: 3, position: 4, to_position: 9 });
  });

  it('rejects invalid flags one by one, naming each bad field, and still stores the valid ones', async () => {
    const good = flag();
    const bad = [
      flag({ id: 'not-a-uuid' }),
      flag({ reason: 'prune-harder' }),
      flag({ reason: 'other', note: '  ' }),
      flag({ toPosition: 3 }),
      flag({ position: 13 }),
      flag({ toPosition: 13 }),
      flag({ flaggedAt: 'last Tuesday' }),
      flag({ blockId: randomUUID() }),
    ];
    const answer = await results(as.scout, [bad[0], good, ...bad.slice(1)]);
    expect(answer[1]).toEqual({ id: good.id, status: 'created' });
    expect([answer[0]!, ...answer.slice(2)].map((r) => [r.status, r.errors?.map((e) => e.field)])).toEqual([
      ['rejected', ['id']],
      ['rejected', ['reason']],
      ['rejected', ['note']],
      ['rejected', ['toPosition']],
      ['rejected', ['position']],
      ['rejected', ['toPosition']],
      ['rejected', ['flaggedAt']],
      ['rejected', ['blockId']],
    ]);
    expect(
      await testDb()('flags').whereIn(
        'id',
        bad.slice(1).map((b) => b.id),
      ),
    ).toHaveLength(0);
  });

  it('refuses a vine of another organisation as if the block did not exist, and does not reveal a stored id', async () => {
    const other = await makeTeam();
    const foreign = await makeBlock(other.org.id);
    const f = flag({ blockId: foreign.id, row: 1, position: 1 });
    expect(await results(as.scout, [f])).toEqual([
      { id: f.id, status: 'rejected', errors: [{ field: 'blockId', message: 'No such block in your organisation' }] },
    ]);

    const mine = flag();
    await results(as.scout, [mine]);
    const stranger = new Client();
    await stranger.signIn(other.scout.email, PASSWORD);
    expect(await results(stranger, [{ ...mine, blockId: foreign.id, row: 1, position: 1 }])).toEqual([{ id: mine.id, status: 'conflict' }]);
    expect((await testDb()('flags').where({ id: mine.id }).first()).organisation_id).toBe(team.org.id);
  });

  it('refuses a batch of 501 flags as a whole', async () => {
    const res = await sync(
      as.scout,
      Array.from({ length: 501 }, () => flag()),
    );
    expect(res.status).toBe(422);
    expect((await res.json()).error.fields.flags[0]).toMatch(/At most 500/);
  });
});

describe('reading and closing flags', () => {
  it('lists the organisation’s open flags with reason, note, address and who flagged them', async () => {
    const f = flag({ row: 4, position: 11, reason: 'heavier-bud-load', note: 'Strong vine, short canes' });
    await results(as.pruner, [f]);
    const res = await as.advisor.fetch(`/api/flags?block=${block.id}`);
    expect(res.status).toBe(200);
    const listed = (await res.json()).flags.find((x: { id: string }) => x.id === f.id);
    expect(listed).toMatchObject({
      blockId: block.id,
      row: 4,
      position: 11,
      toPosition: 11,
      reason: 'heavier-bud-load',
      note: 'Strong vine, short canes',
      flaggedByName: team.pruner.name,
      status: 'open',
      taskId: null,
    });
  });

  it('answers 404 for another organisation’s flag and never lists it', async () => {
    const other = await makeTeam();
    const foreign = await makeBlock(other.org.id);
    const stranger = new Client();
    await stranger.signIn(other.pruner.email, PASSWORD);
    const f = flag({ blockId: foreign.id, row: 1, position: 2 });
    await results(stranger, [f]);
    expect((await as.manager.fetch(`/api/flags/${f.id}`)).status).toBe(404);
    expect((await as.manager.json(`/api/flags/${f.id}`, 'PATCH', { status: 'closed' })).status).toBe(404);
    const all = (await (await as.manager.fetch('/api/flags?status=all')).json()).flags as { id: string }[];
    expect(all.map((x) => x.id)).not.toContain(f.id);
  });

  it('lets a manager close a flag that needs no task, and no one else', async () => {
    const f = flag();
    await results(as.scout, [f]);
    for (const role of ['scout', 'pruner', 'advisor'] as const) {
      expect((await as[role].json(`/api/flags/${f.id}`, 'PATCH', { status: 'closed' })).status, role).toBe(403);
    }
    const res = await as.manager.json(`/api/flags/${f.id}`, 'PATCH', { status: 'closed' });
    expect(res.status).toBe(200);
    expect((await res.json()).flag).toMatchObject({ id: f.id, status: 'closed' });
    expect((await as.manager.json(`/api/flags/${f.id}`, 'PATCH', { status: 'shut' })).status).toBe(422);
  });

  it('rejects unknown list filters with a clear 422', async () => {
    const res = await as.manager.fetch('/api/flags?status=maybe');
    expect(res.status).toBe(422);
    expect((await res.json()).error.fields.status).toBeDefined();
  });

  it('shows open flags on the vine panel and lets the grid’s “flagged only” filter find the vine', async () => {
    const own = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 6 });
    const observation = {
      id: randomUUID(),
      blockId: own.id,
      row: 1,
      position: 3,
      kind: 'weak-budbreak',
      data: { budsRetained: 20, budsPushed: 3 },
      note: '',
      observedAt: '2026-10-01T09:00:00Z',
    };
    expect((await (await as.scout.json('/api/sync', 'POST', { observations: [observation] })).json()).results[0].status).toBe('created');
    const before = await (await as.manager.fetch(`/api/grid/${own.id}?flagged=1`)).json();
    expect(unpackRow(before.cells[0])[2]! % 5).toBe(0);

    const f = flag({ blockId: own.id, row: 1, position: 2, toPosition: 4, reason: 'lighter-bud-load', note: 'Weak push' });
    await results(as.pruner, [f]);
    const after = await (await as.manager.fetch(`/api/grid/${own.id}?flagged=1`)).json();
    // The flagged vine with a finding is coloured; unflagged vines stay blank.
    expect(unpackRow(after.cells[0])[2]! % 5).toBe(4);
    expect(unpackRow(after.cells[1]).every((c) => c % 5 === 0)).toBe(true);

    const panel = await (await as.advisor.fetch(`/api/vines?block=${own.id}&row=1&position=3`)).json();
    expect(panel.flags).toEqual([expect.objectContaining({ id: f.id, text: 'Lighter bud load (vines 2–4): Weak push', by: team.pruner.name })]);
  });
});
