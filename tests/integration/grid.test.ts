import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { planVine, wilsonInterval } from '@/lib/viticulture';
import { unpackRow } from '@/lib/grid/cells';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let block: { id: string };
let manager: Client;
const ids: Record<string, string> = {};

async function as(email: string) {
  const client = new Client();
  await client.signIn(email, PASSWORD);
  return client;
}

const budbreak = (pushed: number, retained = 28) => ({ kind: 'weak-budbreak', data: { budsRetained: retained, budsPushed: pushed } });
const trunk = (severity: string, girdlingPercent: number) => ({ kind: 'trunk-injury', data: { cause: 'mechanical', severity, girdlingPercent } });

async function record(client: Client, name: string, row: number, position: number, what: { kind: string; data: object }, when: string) {
  const id = randomUUID();
  ids[name] = id;
  const res = await client.json('/api/sync', 'POST', {
    observations: [{ id, blockId: block.id, row, position, ...what, note: '', observedAt: when.length > 10 ? when : `${when}T09:00:00Z` }],
  });
  expect((await res.json()).results[0].status, name).toBe('created');
}

/**
 * A hand-built block of 3 rows × 6 vines, row 3 cut short to 4 vines. Codes are slot × 5 + level,
 * level 0 = nothing recorded, 1–4 = worst severity 0–3 (lib/grid/cells.ts).
 */
beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 3, vinesPerRow: 6 });
  const db = testDb();
  await db('vine_positions').where({ block_id: block.id, row_number: 1, position: 5 }).update({ status: 'missing' });
  await db('vine_positions').where({ block_id: block.id, row_number: 1, position: 6 }).update({ status: 'replant', replant_year: 2025 });
  await db('vine_positions').where({ block_id: block.id, row_number: 2, position: 1 }).update({ status: 'dead' });
  await db('vine_positions').where({ block_id: block.id, row_number: 3 }).where('position', '>', 4).delete();
  await db('block_rows').where({ block_id: block.id, row_number: 3 }).update({ vine_count: 4 });

  const [scout, pruner] = [await as(team.scout.email), await as(team.pruner.email)];
  manager = await as(team.manager.email);
  await record(scout, 'r1v1', 1, 1, budbreak(27), '2026-04-20'); // 96 %: severity 0
  await record(scout, 'r1v2-budbreak', 1, 2, budbreak(20), '2026-04-20'); // 71 %: 1
  await record(pruner, 'r1v2-trunk', 1, 2, trunk('severe', 60), '2026-02-10'); // 3
  await record(pruner, 'r1v3', 1, 3, trunk('moderate', 10), '2026-02-10'); // 2, closed below
  await record(scout, 'r1v5', 1, 5, { kind: 'missing-vine', data: { state: 'missing' } }, '2026-03-01'); // 2
  await record(scout, 'r1v6', 1, 6, budbreak(3, 20), '2026-04-21'); // 15 %: 3
  await record(scout, 'r2v2', 2, 2, budbreak(11), '2026-04-22'); // 39 %: 2
  await record(manager, 'r2v3', 2, 3, { kind: 'note', data: {} }, '2026-05-01'); // 0
  await record(pruner, 'r3v1', 3, 1, trunk('light', 5), '2026-02-11'); // 1
  await record(scout, 'r3v1-deleted', 3, 1, budbreak(5), '2026-04-23'); // 3, deleted below
  await record(scout, 'r3v4', 3, 4, budbreak(27), '2026-04-20'); // 0
  // Vines 2 and 3 of row 1 flagged for trunk renewal, as one run.
  const flag = await pruner.json('/api/sync/flags', 'POST', {
    flags: [
      {
        id: randomUUID(),
        blockId: block.id,
        row: 1,
        position: 2,
        toPosition: 3,
        reason: 'trunk-renewal',
        note: 'Mower scar',
        flaggedAt: '2026-02-12T09:00:00Z',
      },
    ],
  });
  expect((await flag.json()).results[0].status).toBe('created');
  await db('observations').where({ id: ids.r1v3 }).update({ status: 'closed', closed_at: db.fn.now() });
  await db('observations').where({ id: ids['r3v1-deleted'] }).update({ deleted_at: db.fn.now() });
});

async function grid(query = '') {
  const res = await manager.fetch(`/api/grid/${block.id}${query}`);
  expect(res.status, await res.clone().text()).toBe(200);
  const body = await res.json();
  // Rows travel as one letter per vine; the tests read the codes.
  return { ...body, wire: body.cells as string[], cells: (body.cells as string[]).map(unpackRow) };
}

describe('GET /api/grid/:blockId', () => {
  it('colours each vine by its worst open finding, with slots shown apart and short rows kept short', async () => {
    const body = await grid();
    expect(body.rows).toEqual([1, 2, 3]);
    // 'A' + code: 1 → B, 4 → E, 13 → N, 9 → J.
    expect(body.wire[0]).toBe('BEAANJ');
    expect(body.cells).toEqual([
      // v1 fine, v2 act now (trunk beats budbreak), v3 closed so blank, v4 blank, v5 missing slot acting, v6 replant act now
      [1, 4, 0, 0, 13, 9],
      // v1 dead slot, v2 act this season, v3 a note (fine)
      [15, 3, 1, 0, 0, 0],
      // v1 watch (the deleted act-now record does not count), v4 fine
      [2, 0, 0, 1],
    ]);
    expect(body.block).toMatchObject({ id: block.id, rowCount: 3, vinesPerRow: 6, rowOrder: 'ascending' });
  });

  it('summarises counts by kind and severity, incidence with its Wilson interval, problem rows and slots', async () => {
    const { summary } = await grid();
    // Vines with any live record, open or closed: r1 v1 v2 v3 v6, r2 v2 v3, r3 v1 v4 (r1 v5 is a
    // hole: its missing-vine record was made without looking at a vine, as the season report counts).
    expect(summary.vinesScouted).toBe(8);
    expect(summary.byLevel).toEqual({ watch: 1, act: 2, urgent: 2 });
    const kinds = Object.fromEntries(summary.kinds.map((k: { kind: string }) => [k.kind, k]));
    // Findings only: a note is a remark, not a problem, and is counted apart with no incidence.
    expect(Object.keys(kinds).sort()).toEqual(['missing-vine', 'trunk-injury', 'weak-budbreak']);
    expect(kinds['weak-budbreak']).toMatchObject({ bySeverity: [2, 1, 1, 1], observations: 5, vinesAffected: 3 });
    expect(kinds['trunk-injury']).toMatchObject({ bySeverity: [0, 1, 0, 1], observations: 2, vinesAffected: 2 });
    expect(kinds['missing-vine']).toMatchObject({ bySeverity: [0, 0, 1, 0], vinesAffected: 1 });
    expect(summary.records).toEqual([{ kind: 'note', bySeverity: [1, 0, 0, 0], vinesAffected: 0, observations: 1, incidence: null }]);
    expect(kinds['trunk-injury'].incidence).toEqual(wilsonInterval(2, 8));
    expect(kinds['weak-budbreak'].incidence).toEqual(wilsonInterval(3, 8));
    // Holes are over every slot: 6 + 6 + 4.
    expect(kinds['missing-vine'].incidence).toEqual(wilsonInterval(1, 16));
    expect(summary.worstRows).toEqual([
      { row: 1, problems: 3, urgent: 2 },
      { row: 2, problems: 1, urgent: 0 },
      { row: 3, problems: 1, urgent: 0 },
    ]);
    expect(summary.slots).toEqual({ planted: 13, replant: 1, missing: 1, dead: 1, none: 0 });
  });

  it('applies kind, status, person, date and flag filters in the query', async () => {
    expect((await grid('?kind=trunk-injury')).cells).toEqual([
      [0, 4, 0, 0, 10, 5],
      [15, 0, 0, 0, 0, 0],
      [2, 0, 0, 0],
    ]);
    expect((await grid('?status=closed')).cells).toEqual([
      [0, 0, 3, 0, 10, 5],
      [15, 0, 0, 0, 0, 0],
      [0, 0, 0, 0],
    ]);
    expect((await grid('?kind=trunk-injury&status=all')).cells[0]).toEqual([0, 4, 3, 0, 10, 5]);
    expect((await grid(`?by=${team.pruner.id}`)).cells).toEqual([
      [0, 4, 0, 0, 10, 5],
      [15, 0, 0, 0, 0, 0],
      [2, 0, 0, 0],
    ]);
    const days = await grid('?from=2026-04-21&to=2026-04-22');
    expect(days.cells).toEqual([
      [0, 0, 0, 0, 10, 9],
      [15, 3, 0, 0, 0, 0],
      [0, 0, 0, 0],
    ]);
    // The period and the person scope the denominator too; kind and status do not.
    expect(days.summary.vinesScouted).toBe(2);
    expect((await grid('?kind=note')).summary.vinesScouted).toBe(8);
    expect((await grid('?kind=weak-budbreak,missing-vine')).cells[0]).toEqual([1, 2, 0, 0, 13, 9]);
    // Only the flagged run (row 1, vines 2–3) keeps its colour; vine 3's one finding is closed.
    const flagged = await grid('?flagged=1');
    expect(flagged.cells).toEqual([
      [0, 4, 0, 0, 10, 5],
      [15, 0, 0, 0, 0, 0],
      [0, 0, 0, 0],
    ]);
    expect(flagged.summary.kinds.map((k: { kind: string; bySeverity: number[] }) => [k.kind, k.bySeverity])).toEqual([
      ['trunk-injury', [0, 0, 0, 1]],
      ['weak-budbreak', [0, 1, 0, 0]],
    ]);
  });

  it('answers 422 naming the one filter it cannot read', async () => {
    for (const [query, field] of [
      ['?kind=frost-bite', 'kind'],
      ['?from=2026-13-40', 'from'],
      ['?from=2026-05-02&to=2026-05-01', 'to'],
      ['?status=maybe', 'status'],
      ['?by=someone', 'by'],
      ['?flagged=yes', 'flagged'],
    ] as const) {
      const res = await manager.fetch(`/api/grid/${block.id}${query}`);
      expect(res.status, query).toBe(422);
      const { error } = await res.json();
      expect(error.code).toBe('invalid-input');
      expect(Object.keys(error.fields), query).toEqual([field]);
    }
  });

  it('follows the block’s row order', async () => {
    await testDb()('blocks').where({ id: block.id }).update({ row_order: 'descending' });
    try {
      const body = await grid();
      expect(body.rows).toEqual([3, 2, 1]);
      expect(body.cells[0]).toEqual([2, 0, 0, 1]);
    } finally {
      await testDb()('blocks').where({ id: block.id }).update({ row_order: 'ascending' });
    }
  });

  it('lets every role read it and answers 404 for another organisation’s block or a malformed id, 401 when signed out', async () => {
    for (const role of ['scout', 'pruner', 'advisor'] as const) {
      expect((await (await as(team[role].email)).fetch(`/api/grid/${block.id}`)).status, role).toBe(200);
    }
    const other = await makeTeam();
    const stranger = await as(other.manager.email);
    const res = await stranger.fetch(`/api/grid/${block.id}`);
    expect(res.status).toBe(404);
    expect((await res.json()).error.code).toBe('not-found');
    expect((await manager.fetch('/api/grid/not-a-block')).status).toBe(422);
    expect((await new Client().fetch(`/api/grid/${block.id}`)).status).toBe(401);
  });
});

describe('the vine panel', () => {
  it('gives the address, status, every observation newest first, and a phone link to the vine', async () => {
    const res = await manager.fetch(`/api/vines?block=${block.id}&row=1&position=2`);
    expect(res.status).toBe(200);
    const panel = await res.json();
    expect(panel.vine).toMatchObject({ blockId: block.id, row: 1, position: 2, status: 'planted', trainingSystem: 'cane', vinesPerPanel: 5 });
    expect(panel.observations.map((o: { id: string }) => o.id)).toEqual([ids['r1v2-budbreak'], ids['r1v2-trunk']]);
    expect(panel.observations[1]).toMatchObject({ kind: 'trunk-injury', severity: 3, status: 'open', summary: 'mechanical, severe; 60% girdled' });
    expect(panel.observations[1].recordedByName).toBe(team.pruner.name);
    expect(panel.walkUrl).toBe(`/field/blocks/${block.id}/walk?row=1&position=2`);
    expect(panel.flags).toEqual([expect.objectContaining({ text: 'Trunk renewal (vines 2–3): Mower scar', by: team.pruner.name })]);
    expect(panel.comments).toEqual([]);

    const byId = await (await manager.fetch(`/api/vines/${panel.vine.positionId}`)).json();
    expect(byId).toEqual(panel);
  });

  it('shows closed findings in the history and leaves deleted ones out', async () => {
    const closed = await (await manager.fetch(`/api/vines?block=${block.id}&row=1&position=3`)).json();
    expect(closed.observations).toHaveLength(1);
    expect(closed.observations[0]).toMatchObject({ id: ids.r1v3, status: 'closed' });
    const deleted = await (await manager.fetch(`/api/vines?block=${block.id}&row=3&position=1`)).json();
    expect(deleted.observations.map((o: { id: string }) => o.id)).toEqual([ids.r3v1]);
  });

  it('plans the vine with planVine from the canes measured on the latest day, in the order measured, and the latest pruning weight', async () => {
    const pruner = await as(team.pruner.email);
    const cane = (diameterMm: number, longestInternodeMm: number) => ({ kind: 'cane-diameter', data: { diameterMm, longestInternodeMm, exposure: 'sun' } });
    await record(pruner, 'old-cane', 2, 4, cane(5.5, 70), '2026-01-10');
    await record(pruner, 'cane-a', 2, 4, cane(9.5, 70), '2026-01-20T09:00:00Z');
    await record(pruner, 'cane-b', 2, 4, cane(11.5, 80), '2026-01-20T09:01:00Z');
    await record(pruner, 'cane-c', 2, 4, cane(7, 120), '2026-01-20T09:02:00Z');
    await record(
      pruner,
      'weight',
      2,
      4,
      { kind: 'pruning-record', data: { canesKept: 2, budsPerCane: 14, renewalSpurs: 2, pruningWeightKg: 0.9 } },
      '2026-01-21',
    );
    const panel = await (await manager.fetch(`/api/vines?block=${block.id}&row=2&position=4`)).json();
    const canes = [
      { baseDiameterMm: 9.5, longestInternodeMm: 70, exposure: 'sun' },
      { baseDiameterMm: 11.5, longestInternodeMm: 80, exposure: 'sun' },
      { baseDiameterMm: 7, longestInternodeMm: 120, exposure: 'sun' },
    ] as const;
    expect(panel.plan.measuredOn).toBe('2026-01-20');
    expect(panel.plan.pruningWeightKg).toBe(0.9);
    expect(panel.plan.canes).toEqual(canes);
    expect(panel.plan.plan).toEqual(planVine({ trainingSystem: 'cane', canes, pruningWeight: 0.9, weightUnit: 'kg' }));

    const none = await (await manager.fetch(`/api/vines?block=${block.id}&row=1&position=4`)).json();
    expect(none.plan).toMatchObject({ plan: null, reason: 'No canes measured on this vine yet.' });
  });

  it('answers 404 for another organisation’s vine by id or address, and 422 for an address it cannot read', async () => {
    const mine = await (await manager.fetch(`/api/vines?block=${block.id}&row=1&position=1`)).json();
    const other = await makeTeam();
    const stranger = await as(other.advisor.email);
    expect((await stranger.fetch(`/api/vines/${mine.vine.positionId}`)).status).toBe(404);
    expect((await stranger.fetch(`/api/vines?block=${block.id}&row=1&position=1`)).status).toBe(404);
    expect((await manager.fetch(`/api/vines?block=${block.id}&row=1&position=99`)).status).toBe(404);
    expect((await manager.fetch('/api/vines/12345')).status).toBe(422);
    const bad = await manager.fetch(`/api/vines?block=${block.id}&row=first&position=1`);
    expect(bad.status).toBe(422);
    expect(Object.keys((await bad.json()).error.fields)).toEqual(['row']);
    expect((await new Client().fetch(`/api/vines/${mine.vine.positionId}`)).status).toBe(401);
  });
});
