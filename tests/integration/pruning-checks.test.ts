import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { planVine } from '@/lib/viticulture';
import { unpackRow } from '@/lib/grid/cells';
import { closeTestDb, makeBlock, makeMember, makeTeam, PASSWORD } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let block: { id: string };
let second: { id: string; name: string };
const as: Record<'manager' | 'scout' | 'pruner' | 'advisor', Client> = {} as never;

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 3, vinesPerRow: 20 });
  second = await makeMember(team.org.id, 'pruner');
  for (const role of ['manager', 'scout', 'pruner', 'advisor'] as const) {
    as[role] = new Client();
    await as[role].signIn(team[role].email, PASSWORD);
  }
});

const check = (row: number, position: number, data: Record<string, unknown>, over: Record<string, unknown> = {}) => ({
  id: randomUUID(),
  blockId: block.id,
  row,
  position,
  kind: 'pruning-check',
  data,
  note: '',
  observedAt: '2026-12-01T09:00:00Z',
  ...over,
});

async function sync(client: Client, observations: unknown[]) {
  const res = await client.json('/api/sync', 'POST', { observations });
  expect(res.status, await res.clone().text()).toBe(200);
  return (await res.json()).results as { id: string; status: string; errors?: { field: string; message: string }[] }[];
}

describe('recording a pruning check', () => {
  it('is recorded once like any observation by a crew lead (pruner) or a manager, with its severity against the target', async () => {
    const c = check(1, 1, { prunedBy: second.id, canesKept: 2, budsOnCanes: 40, renewalSpurs: 2, budTarget: 28 });
    expect(await sync(as.pruner, [c])).toEqual([{ id: c.id, status: 'created' }]);
    expect(await sync(as.pruner, [c])).toEqual([{ id: c.id, status: 'duplicate' }]);
    const m = check(1, 2, { prunedBy: second.id, canesKept: 2, budsOnCanes: 24, renewalSpurs: 2, budTarget: 28 });
    expect(await sync(as.manager, [m])).toEqual([{ id: m.id, status: 'created' }]);
    const grid = await (await as.advisor.fetch(`/api/grid/${block.id}?kind=pruning-check`)).json();
    // 44 buds for 28 is 57% over: act now (cell level 4); 28 for 28 is fine (level 1).
    expect(unpackRow(grid.cells[0]).slice(0, 2)).toEqual([4, 1]);
  });

  it('is refused to a scout and for someone outside the organisation, field by field', async () => {
    const stranger = await makeTeam();
    const [byManager, outsider, missing] = await sync(as.manager, [
      check(2, 1, { prunedBy: second.id, canesKept: 2, budsOnCanes: 20, renewalSpurs: 1 }),
      check(2, 2, { prunedBy: stranger.pruner.id, canesKept: 2, budsOnCanes: 20, renewalSpurs: 1 }),
      check(2, 3, { canesKept: 2, budsOnCanes: 20, renewalSpurs: 1 }),
    ]);
    expect(byManager!.status).toBe('created');
    expect(outsider).toMatchObject({ status: 'rejected', errors: [{ field: 'data.prunedBy', message: 'No such person in your organisation' }] });
    expect(missing!.errors!.map((e) => e.field)).toEqual(['data.prunedBy']);
    const [scout] = await sync(as.scout, [check(2, 4, { prunedBy: second.id, canesKept: 2, budsOnCanes: 20, renewalSpurs: 1 })]);
    expect(scout).toMatchObject({ status: 'rejected', errors: [{ field: 'kind', message: 'Only a crew lead (pruner) or a manager records pruning checks' }] });
  });
});

describe('GET /api/pruning-checks', () => {
  it('shows each pruner’s deviation over the sample against the block target and each vine’s plan', async () => {
    const own = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 10 });
    const lead = await makeMember(team.org.id, 'pruner');
    const at = (row: number, position: number, data: Record<string, unknown>) => check(row, position, { prunedBy: lead.id, ...data }, { blockId: own.id });
    // Two canes measured on vine 1/5 before the check: the plan comes from planVine.
    const canes = [9.5, 10.2, 6.0].map((diameterMm) => ({
      id: randomUUID(),
      blockId: own.id,
      row: 1,
      position: 5,
      kind: 'cane-diameter',
      data: { diameterMm },
      note: '',
      observedAt: '2026-11-30T09:00:00Z',
    }));
    await sync(as.pruner, canes);
    await sync(as.manager, [
      at(1, 5, { canesKept: 2, budsOnCanes: 30, renewalSpurs: 2, budTarget: 30 }), // 34 buds: +13.3%
      at(1, 6, { canesKept: 2, budsOnCanes: 22, renewalSpurs: 2, budTarget: 30 }), // 26 buds: −13.3%
      at(2, 1, { canesKept: 2, budsOnCanes: 26, renewalSpurs: 2, budTarget: 30 }), // 30 buds: on target
      at(2, 2, { canesKept: 1, budsOnCanes: 12, renewalSpurs: 0 }), // no target given
    ]);

    const res = await as.advisor.fetch(`/api/pruning-checks?block=${own.id}`);
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.finePercent).toBe(10);
    expect(body.pruners).toHaveLength(1);
    const plan = planVine({ trainingSystem: 'cane', canes: [{ baseDiameterMm: 9.5 }, { baseDiameterMm: 10.2 }, { baseDiameterMm: 6.0 }] });
    expect(body.pruners[0]).toEqual({
      prunerId: lead.id,
      prunerName: lead.name,
      vines: 4,
      budsLeftMean: 25.5,
      targetDeviationMeanPercent: 0,
      offTargetShare: 0.7,
      renewalSpursMean: 1.5,
      planChecks: 1,
      planDeviationMeanBuds: 34 - plan.totalBuds,
      planSpurDeviationMean: 2 - plan.renewalSpurs,
    });
    const measured = body.checks.find((c: { row: number; position: number }) => c.row === 1 && c.position === 5);
    expect(measured).toMatchObject({ budsLeft: 34, budTarget: 30, targetDeviationPercent: 13.3, planBuds: plan.totalBuds });
  });

  it('reads only the organisation’s own checks and names bad filters', async () => {
    const other = await makeTeam();
    const stranger = new Client();
    await stranger.signIn(other.manager.email, PASSWORD);
    const body = await (await stranger.fetch('/api/pruning-checks')).json();
    expect(body.checks).toEqual([]);
    const bad = await as.manager.fetch('/api/pruning-checks?from=2026-12-05&to=2026-12-01');
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.fields.to).toEqual(['Must be on or after the start date']);
    expect((await new Client().fetch('/api/pruning-checks')).status).toBe(401);
  });
});
