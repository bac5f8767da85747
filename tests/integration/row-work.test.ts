import { randomUUID } from 'node:crypto';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

type Team = Awaited<ReturnType<typeof makeTeam>>;
type Result = { id: string; status: string; errors?: { field: string; message: string }[] };
let team: Team;
let other: Team;
let block: { id: string };
let otherBlock: { id: string };
const as: Record<'manager' | 'scout' | 'pruner' | 'advisor', Client> = {} as never;

beforeAll(async () => {
  [team, other] = await Promise.all([makeTeam(), makeTeam()]);
  block = await makeBlock(team.org.id, { rows: 4, vinesPerRow: 10 });
  otherBlock = await makeBlock(other.org.id, { rows: 4, vinesPerRow: 10 });
  for (const role of ['manager', 'scout', 'pruner', 'advisor'] as const) {
    as[role] = new Client();
    await as[role].signIn(team[role].email, PASSWORD);
  }
});

const work = (over: Record<string, unknown> = {}): Record<string, unknown> & { id: string } => ({
  id: randomUUID(),
  blockId: block.id,
  row: 1,
  pass: 'brush-removal',
  crewSize: 3,
  personHours: 6,
  startedAt: '2025-06-10T08:00:00+12:00',
  finishedAt: '2025-06-10T10:00:00+12:00',
  note: 'Brush pulled',
  ...over,
});

const sync = (client: Client, records: unknown[]) => client.json('/api/sync/row-work', 'POST', { records });

async function results(client: Client, records: unknown[]): Promise<Result[]> {
  const res = await sync(client, records);
  expect(res.status, await res.clone().text()).toBe(200);
  return (await res.json()).results;
}

describe('POST /api/sync/row-work: who records', () => {
  it.each([
    ['manager', 200],
    ['pruner', 200],
    ['scout', 403],
    ['advisor', 403],
  ] as const)('answers %s with %i', async (role, status) => {
    const r = work();
    const res = await sync(as[role], [r]);
    expect(res.status).toBe(status);
    if (status === 403) expect((await res.json()).error.code).toBe('forbidden');
    expect(await testDb()('row_work').where({ id: r.id })).toHaveLength(status === 200 ? 1 : 0);
  });

  it('answers 401 to a signed-out device and stores nothing', async () => {
    const r = work();
    expect((await sync(new Client(), [r])).status).toBe(401);
    expect(await testDb()('row_work').where({ id: r.id })).toHaveLength(0);
  });
});

describe('POST /api/sync/row-work: once only', () => {
  it('stores a record once: created, then duplicate on a retry, with who recorded it', async () => {
    const r = work({ row: 2, fromPosition: 3, toPosition: 7 });
    expect(await results(as.pruner, [r])).toEqual([{ id: r.id, status: 'created' }]);
    // The same record with its keys in another order and its times written in UTC.
    const retry = { ...r, startedAt: '2025-06-09T20:00:00Z', finishedAt: '2025-06-09T22:00:00.000Z' };
    expect(await results(as.pruner, [Object.fromEntries(Object.entries(retry).reverse())])).toEqual([{ id: r.id, status: 'duplicate' }]);
    const stored = await testDb()('row_work').where({ id: r.id });
    expect(stored).toHaveLength(1);
    expect(stored[0]).toMatchObject({ row_number: 2, from_position: 3, to_position: 7, crew_size: 3, recorded_by: team.pruner.id, pass: 'brush-removal' });
    expect(Number(stored[0].person_hours)).toBe(6);
  });

  it('answers conflict to another payload under a stored id and keeps the stored one', async () => {
    const r = work();
    await results(as.manager, [r]);
    expect(await results(as.manager, [{ ...r, personHours: 7 }])).toEqual([{ id: r.id, status: 'conflict' }]);
    expect(Number((await testDb()('row_work').where({ id: r.id }).first()).person_hours)).toBe(6);
  });

  it('tells apart the same id twice in one batch: the first is created, an equal copy is a duplicate, another payload a conflict', async () => {
    const r = work();
    expect((await results(as.manager, [r, { ...r }, { ...r, note: 'other' }])).map((x) => x.status)).toEqual(['created', 'duplicate', 'conflict']);
  });
});

describe('POST /api/sync/row-work: rejected one by one', () => {
  it('rejects each bad field and still stores the valid records of the batch', async () => {
    const good = work();
    const batch = [
      work({ row: 5 }),
      work({ personHours: 0 }),
      work({ personHours: -2 }),
      work({ pass: 'harvest' }),
      work({ toPosition: 11 }),
      work({ fromPosition: 6, toPosition: 4 }),
      work({ crewSize: 0 }),
      work({ finishedAt: 'yesterday' }),
      good,
      { ...work(), id: 'not-a-uuid' },
      work({ colour: 'red' }),
    ];
    const answer = await results(as.pruner, batch);
    expect(answer).toHaveLength(batch.length);
    const fields = answer.map((a) => (a.status === 'rejected' ? a.errors!.map((e) => e.field).join(',') : a.status));
    expect(fields).toEqual(['row', 'personHours', 'personHours', 'pass', 'toPosition', 'toPosition', 'crewSize', 'finishedAt', 'created', 'id', '_']);
    expect(answer[0]!.errors![0]!.message).toMatch(/no row 5/);
    expect(answer.map((a) => a.id).slice(0, 9)).toEqual(batch.slice(0, 9).map((b) => b.id));
    const stored = await testDb()('row_work')
      .whereIn(
        'id',
        batch.map((b) => b.id).filter((id) => id !== 'not-a-uuid'),
      )
      .pluck('id');
    expect(stored).toEqual([good.id]);
  });

  it("rejects another organisation's block as if it did not exist", async () => {
    const r = work({ blockId: otherBlock.id });
    expect(await results(as.manager, [r])).toEqual([
      { id: r.id, status: 'rejected', errors: [{ field: 'blockId', message: 'No such block in your organisation' }] },
    ]);
    expect(await testDb()('row_work').where({ id: r.id })).toHaveLength(0);
  });

  it('answers 422 to more than 500 records and stores none of them', async () => {
    const batch = Array.from({ length: 501 }, () => work());
    const res = await sync(as.manager, batch);
    expect(res.status).toBe(422);
    expect((await res.json()).error.fields).toHaveProperty('records');
    expect(
      await testDb()('row_work').whereIn(
        'id',
        batch.map((b) => b.id),
      ),
    ).toHaveLength(0);
  });

  it('stores 500 records in one request', async () => {
    const batch = Array.from({ length: 500 }, (_, i) => work({ row: 1 + (i % 4) }));
    const answer = await results(as.manager, batch);
    expect(answer.every((a) => a.status === 'created')).toBe(true);
    expect(
      Number(
        (await testDb()('row_work')
          .whereIn(
            'id',
            batch.map((b) => b.id),
          )
          .count({ n: '*' })
          .first())!.n,
      ),
    ).toBe(500);
  });
});

describe('GET /api/blocks/{id}/progress', () => {
  // A 4 × 10 cane-pruned block with two missing slots at the end of row 4: 38 standing vines.
  let progressBlock: { id: string };
  const progress = async (client: Client, season = '2026', id = progressBlock.id) => {
    const res = await client.fetch(`/api/blocks/${id}/progress?season=${season}`);
    expect(res.status, await res.clone().text()).toBe(200);
    return (await res.json()) as { season: number; passes: Record<string, unknown>[] };
  };
  const pass = (body: { passes: Record<string, unknown>[] }, name: string) => body.passes.find((p) => p.pass === name)!;
  const at = (day: string) => `2026-07-${day}T15:00:00Z`;

  beforeAll(async () => {
    progressBlock = await makeBlock(team.org.id, { rows: 4, vinesPerRow: 10 });
    await testDb()('vine_positions').where({ block_id: progressBlock.id, row_number: 4 }).whereIn('position', [9, 10]).update({ status: 'missing' });
    const r = (o: Record<string, unknown>) => work({ blockId: progressBlock.id, pass: 'pruning', startedAt: undefined, ...o });
    expect(
      (
        await results(as.pruner, [
          r({ row: 1, crewSize: 2, personHours: 8, finishedAt: at('01') }),
          r({ row: 2, fromPosition: 1, toPosition: 6, crewSize: 1, personHours: 1.5, finishedAt: at('01') }),
          // A repeated row: hours add up, vines do not.
          r({ row: 1, crewSize: 1, personHours: 2, finishedAt: at('02') }),
          r({ row: 4, fromPosition: 1, toPosition: 8, crewSize: 1, personHours: 2, finishedAt: at('02') }),
          r({ row: 1, pass: 'tying', crewSize: 1, personHours: 1, finishedAt: at('03') }),
          // Last season's work stays in last season.
          r({ row: 3, crewSize: 1, personHours: 4, finishedAt: '2025-07-01T10:00:00Z' }),
        ])
      ).map((x) => x.status),
    ).toEqual(Array(6).fill('created'));
    // Overlapping the pruner's run 1–6: row 2 is now covered end to end, vines 5 and 6 once.
    expect((await results(as.manager, [r({ row: 2, fromPosition: 5, toPosition: 10, crewSize: 1, personHours: 1.5, finishedAt: at('02') })]))[0]!.status).toBe(
      'created',
    );
  });

  it('answers exactly the contract, with figures worked by hand', async () => {
    await testDb()('organisations').where({ id: team.org.id }).update({ pay_basis: 'hourly', hourly_rate: 20, piece_rate_per_vine: null });
    const body = await progress(as.advisor);
    expect(body.season).toBe(2026);
    expect(body.passes.map((p) => p.pass)).toEqual(['pre-pruning', 'pruning', 'brush-removal', 'tying', 'shoot-thinning']);
    expect(pass(body, 'pruning')).toEqual({
      pass: 'pruning',
      rowCount: 4,
      // Rows 1 and 2 end to end; row 4 stops at vine 8.
      rowsDone: 2,
      vineCount: 38,
      // Row 1: 10 (twice over, counted once); row 2: 1–6 and 5–10 overlap, 10; row 4: 8 standing.
      vinesDone: 28,
      // 8 + 1.5 + 2 + 2 + 1.5
      personHours: 15,
      // 28 ÷ 15 = 1.8666…
      vinesPerPersonHour: 1.87,
      // 38 standing vines × 1.75 min (cane) ÷ 60 = 1.1083 h
      estimatedHours: 1.11,
      // 28 vines in 2 days worked = 14 a day; 10 left → 1 more day after 2 July
      projectedFinish: '2026-07-03',
      // 15 h × 20
      costToDate: 300,
      // (15 + 10 ÷ (28 ÷ 15)) h × 20 = 20.357 h × 20 = 407.14
      projectedCost: 407.14,
    });
    // Tying: 10 vines on 3 July, 28 left at 10 a day → 3 more days.
    expect(pass(body, 'tying')).toMatchObject({ rowsDone: 1, vinesDone: 10, personHours: 1, estimatedHours: null, projectedFinish: '2026-07-06' });
    expect(pass(body, 'shoot-thinning')).toMatchObject({
      rowsDone: 0,
      vinesDone: 0,
      personHours: 0,
      vinesPerPersonHour: null,
      projectedFinish: null,
      costToDate: 0,
      projectedCost: null,
    });
  });

  it('counts no vine in a missing slot, whether the run covers the whole row or only part of it', async () => {
    const r = (o: Record<string, unknown>) => work({ blockId: progressBlock.id, pass: 'pre-pruning', startedAt: undefined, finishedAt: at('04'), ...o });
    await results(as.manager, [r({ row: 4 }), r({ row: 3, fromPosition: 9, toPosition: 10 }), r({ row: 4, fromPosition: 7 })]);
    // Row 4: 10 slots less the 2 missing ones, once though covered twice; row 3: vines 9 and 10.
    expect(pass(await progress(as.manager), 'pre-pruning')).toMatchObject({ rowsDone: 1, vinesDone: 10, vineCount: 38, personHours: 18 });
  });

  it('prices the same work at a piece rate per vine', async () => {
    await testDb()('organisations').where({ id: team.org.id }).update({ pay_basis: 'piece-rate', hourly_rate: null, piece_rate_per_vine: 0.5 });
    const body = await progress(as.manager);
    // 28 vines × 0.50 done; all 38 standing vines × 0.50 for the pass.
    expect(pass(body, 'pruning')).toMatchObject({ costToDate: 14, projectedCost: 19 });
    await testDb()('organisations').where({ id: team.org.id }).update({ pay_basis: 'hourly', hourly_rate: null, piece_rate_per_vine: null });
    expect(pass(await progress(as.manager), 'pruning')).toMatchObject({ costToDate: null, projectedCost: null });
  });

  it('shows the recorded hours and cost beside the estimate in the season report’s labour section', async () => {
    await testDb()('organisations').where({ id: team.org.id }).update({ pay_basis: 'hourly', hourly_rate: 20, piece_rate_per_vine: null });
    const res = await as.advisor.fetch(`/api/reports/blocks/${progressBlock.id}?season=2026`);
    expect(res.status, await res.clone().text()).toBe(200);
    const { report } = await res.json();
    // Pruning 15 h × 20 on 28 vines; every pass 15 + 1 (tying) + 18 (pre-pruning) = 34 h × 20.
    expect(report.labour.recorded).toEqual({ pruningHours: 15, pruningCost: 300, pruningVines: 28, allHours: 34, allCost: 680 });
    // The estimate beside it: 38 standing vines × 1.75 min ÷ 60.
    expect(report.labour.estimate.hours).toBeCloseTo((38 * 1.75) / 60, 9);
  });

  it('reads last season on its own', async () => {
    expect(pass(await progress(as.manager, '2025'), 'pruning')).toMatchObject({ rowsDone: 1, vinesDone: 10, personHours: 4 });
  });

  it("answers 404 for another organisation's block, and 422 for a season that is not a year", async () => {
    const res = await as.manager.fetch(`/api/blocks/${otherBlock.id}/progress?season=2026`);
    expect(res.status).toBe(404);
    const bad = await as.manager.fetch(`/api/blocks/${progressBlock.id}/progress?season=26`);
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.fields).toHaveProperty('season');
    expect((await new Client().fetch(`/api/blocks/${progressBlock.id}/progress?season=2026`)).status).toBe(401);
  });

  it('tells the phone which rows are done this season in each pass', async () => {
    const fresh = await makeBlock(team.org.id, { rows: 3, vinesPerRow: 5 });
    const now = new Date().toISOString();
    await results(as.pruner, [
      work({ blockId: fresh.id, row: 2, pass: 'pruning', startedAt: undefined, finishedAt: now }),
      work({ blockId: fresh.id, row: 3, pass: 'pruning', fromPosition: 1, toPosition: 4, startedAt: undefined, finishedAt: now }),
    ]);
    const res = await as.pruner.fetch(`/api/field/blocks/${fresh.id}/row-work`);
    expect(res.status).toBe(200);
    expect((await res.json()).done).toEqual({ pruning: [2] });
    expect((await as.pruner.fetch(`/api/field/blocks/${otherBlock.id}/row-work`)).status).toBe(404);
  });

  it('exports the season’s row work as CSV, one line a record', async () => {
    const res = await as.advisor.fetch(`/api/reports/row-work.csv?season=2026&blockId=${progressBlock.id}`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('text/csv');
    const parsed = Papa.parse<Record<string, string>>((await res.text()).trim(), { header: true });
    // Six pruning and tying records of 2026 and three of pre-pruning; last season's stays out.
    expect(parsed.data).toHaveLength(9);
    expect(parsed.data.map((d) => Number(d.person_hours)).reduce((a, b) => a + b, 0)).toBe(34);
    expect(parsed.data).toContainEqual(
      expect.objectContaining({ season: '2026', pass: 'pruning', row: '1', person_hours: '8', recorded_by: team.pruner.name }),
    );
  });
});
