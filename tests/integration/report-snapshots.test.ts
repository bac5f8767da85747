import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

/**
 * Block reports are kept once worked out (db/migrations/20261205-01-report-snapshots.ts) and used
 * while nothing they read has changed. Each test below plants a mark in the kept report, then makes
 * one kind of change: the report must come back worked out again, without the mark. Without the
 * trigger for that table the mark would still show.
 */
afterAll(closeTestDb);

const SEASON = 2026;
const MARK = 'Read from the kept report';

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let block: { id: string };
let other: { id: string };
let manager: Client;

async function as(email: string) {
  const client = new Client();
  await client.signIn(email, PASSWORD);
  return client;
}

async function estate() {
  const res = await manager.fetch(`/api/reports?season=${SEASON}`);
  expect(res.status, await res.clone().text()).toBe(200);
  const body = (await res.json()) as { blocks: { block: { id: string; name: string }; scouting: { vinesScouted: number } }[] };
  return new Map(body.blocks.map((b) => [b.block.id, b]));
}

/** Reads the estate report (so both blocks are kept), then marks what was kept. */
async function markKept() {
  await estate();
  const marked = await testDb()('report_snapshots')
    .whereIn('block_id', [block.id, other.id])
    .where({ season: SEASON })
    .update({ report: testDb().raw(`jsonb_set(report, '{block,name}', to_jsonb(?::text))`, [MARK]) });
  expect(marked).toBe(2);
  const read = await estate();
  expect(read.get(block.id)!.block.name).toBe(MARK);
  expect(read.get(other.id)!.block.name).toBe(MARK);
}

async function expectWorkedOutAgain() {
  const read = await estate();
  expect(read.get(block.id)!.block.name).not.toBe(MARK);
  // The block that did not change is still read from its kept report.
  expect(read.get(other.id)!.block.name).toBe(MARK);
  return read.get(block.id)!;
}

async function syncObservation(row: number, position: number) {
  const id = randomUUID();
  const res = await manager.json('/api/sync', 'POST', {
    observations: [
      {
        id,
        blockId: block.id,
        row,
        position,
        kind: 'weak-budbreak',
        data: { budsRetained: 28, budsPushed: 9 },
        note: '',
        observedAt: `${SEASON}-07-01T09:00:00Z`,
      },
    ],
  });
  expect((await res.json()).results[0]).toMatchObject({ status: 'created' });
  return id;
}

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 3, vinesPerRow: 10, name: 'Kept block' });
  other = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 5, name: 'Untouched block' });
  manager = await as(team.manager.email);
  await syncObservation(1, 1);
});

describe('kept block reports', () => {
  it('answers from a kept report exactly what it answered when it worked the report out', async () => {
    await syncObservation(1, 5);
    const read = async () => (await manager.fetch(`/api/reports?season=${SEASON}`)).json();
    const workedOut = await read();
    expect(Number((await testDb()('report_snapshots').where({ block_id: block.id }).count({ n: '*' }))[0]!.n)).toBeGreaterThan(0);
    expect(await read()).toEqual(workedOut);
  });

  it('reads an unchanged block from its kept report, and works it out again after a record syncs', async () => {
    await markKept();
    const before = (await estate()).get(block.id)!.scouting.vinesScouted;
    await syncObservation(2, 3);
    const after = await expectWorkedOutAgain();
    expect(after.scouting.vinesScouted).toBe(before + 1);
  });

  it('works a block out again after a record is edited or deleted', async () => {
    const id = await syncObservation(3, 4);
    await markKept();
    await testDb()('observations').where({ id }).update({ status: 'closed', closed_at: new Date() });
    await expectWorkedOutAgain();
    await markKept();
    await testDb()('observations').where({ id }).update({ deleted_at: new Date() });
    await expectWorkedOutAgain();
  });

  it('works a block out again after a weight is entered', async () => {
    await markKept();
    const res = await manager.json('/api/measurements', 'POST', {
      blockId: block.id,
      kind: 'pruning-weight',
      row: 1,
      position: 2,
      weightUnit: 'kg',
      weight: 0.8,
      measuredOn: `${SEASON}-07-02`,
    });
    expect(res.status, await res.clone().text()).toBe(201);
    await expectWorkedOutAgain();
  });

  it('works a block out again after a flag, a task on it, and a step of the task', async () => {
    await markKept();
    const flagId = randomUUID();
    const flagged = await manager.json('/api/sync/flags', 'POST', {
      flags: [{ id: flagId, blockId: block.id, row: 2, position: 5, reason: 'replant', note: '', flaggedAt: `${SEASON}-07-03T09:00:00Z` }],
    });
    expect(flagged.status, await flagged.clone().text()).toBe(200);
    await expectWorkedOutAgain();

    await markKept();
    const made = await manager.json('/api/tasks', 'POST', { flagIds: [flagId], assigneeId: team.pruner.id, dueOn: `${SEASON}-08-01`, priority: 'normal' });
    expect(made.status, await made.clone().text()).toBe(201);
    await expectWorkedOutAgain();

    await markKept();
    await testDb()('task_items')
      .whereIn('task_id', testDb()('tasks').where({ block_id: block.id }).select('id'))
      .update({ status: testDb().raw('status') });
    await expectWorkedOutAgain();
  });

  it('works a block out again after row work is recorded', async () => {
    await markKept();
    const res = await manager.json('/api/sync/row-work', 'POST', {
      records: [
        {
          id: randomUUID(),
          blockId: block.id,
          row: 1,
          pass: 'pruning',
          crewSize: 2,
          personHours: 3,
          startedAt: `${SEASON}-07-04T08:00:00Z`,
          finishedAt: `${SEASON}-07-04T09:30:00Z`,
          note: '',
        },
      ],
    });
    expect((await res.json()).results[0]).toMatchObject({ status: 'created' });
    await expectWorkedOutAgain();
  });

  it.each([
    ['a slot is marked missing', () => testDb()('vine_positions').where({ block_id: block.id, row_number: 3, position: 10 }).update({ status: 'missing' })],
    [
      'a vine is planted in a slot',
      async () => {
        const slot = await testDb()('vine_positions').where({ block_id: block.id, row_number: 3, position: 9 }).first('id');
        await testDb()('vines').insert({ position_id: slot.id, planting_year: 2025, clone: '777', rootstock: '101-14' });
      },
    ],
    [
      'a row changes',
      () =>
        testDb()('block_rows')
          .where({ block_id: block.id, row_number: 1 })
          .update({ vine_count: testDb().raw('vine_count') }),
    ],
    ['the block is renamed', () => testDb()('blocks').where({ id: block.id }).update({ name: 'Kept block, renamed' })],
  ])('works a block out again after %s', async (_, change) => {
    await markKept();
    await change();
    await expectWorkedOutAgain();
  });

  it.each([
    [
      'the organisation changes (pay rates, season start)',
      () =>
        testDb()('organisations')
          .where({ id: team.org.id })
          .update({ name: `${team.org.name} renamed` }),
    ],
    ['a member is renamed', () => testDb()('users').where({ id: team.pruner.id }).update({ name: 'Renamed Pruner' })],
  ])('works every block out again after %s', async (_, change) => {
    await markKept();
    await change();
    const read = await estate();
    expect(read.get(block.id)!.block.name).not.toBe(MARK);
    expect(read.get(other.id)!.block.name).not.toBe(MARK);
  });

  it('keeps a report per set of inputs and units: other inputs are worked out, not read from the kept one', async () => {
    await markKept();
    const res = await manager.fetch(`/api/reports?season=${SEASON}&hourlyCost=31`);
    const body = (await res.json()) as { blocks: { block: { name: string } }[] };
    expect(body.blocks.map((b) => b.block.name)).not.toContain(MARK);
  });

  it("uses the block report's kept seasons too, and drops a block's reports that can no longer be used", async () => {
    const read = async () => {
      const res = await manager.fetch(`/api/reports/blocks/${block.id}?season=${SEASON}`);
      expect(res.status).toBe(200);
      return (await res.json()) as { report: { block: { name: string } } };
    };
    await read();
    await testDb()('report_snapshots')
      .where({ block_id: block.id, season: SEASON })
      .update({ report: testDb().raw(`jsonb_set(report, '{block,name}', to_jsonb(?::text))`, [MARK]) });
    expect((await read()).report.block.name).toBe(MARK);
    await syncObservation(1, 7);
    expect((await read()).report.block.name).not.toBe(MARK);
    const { revision } = await testDb()('block_revisions').where({ block_id: block.id }).first('revision');
    const stale = await testDb()('report_snapshots').where({ block_id: block.id }).andWhere('revision', '<', revision).count({ n: '*' });
    expect(Number(stale[0]!.n)).toBe(0);
  });
});
