import { randomUUID } from 'node:crypto';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

/**
 * An estate whose seasons start in July, as a southern-hemisphere estate's would: season 2026 runs
 * from 1 July 2025 to 30 June 2026 (pruning in July–August 2025, harvest in March 2026).
 */
let team: Awaited<ReturnType<typeof makeTeam>>;
let block: { id: string };
let manager: Client;

async function record(client: Client, row: number, position: number, kind: string, data: object, at: string) {
  const res = await client.json('/api/sync', 'POST', {
    observations: [{ id: randomUUID(), blockId: block.id, row, position, kind, data, note: '', observedAt: at }],
  });
  expect((await res.json()).results[0].status).toBe('created');
}

async function weigh(client: Client, body: object) {
  const res = await client.json('/api/measurements', 'POST', { blockId: block.id, weightUnit: 'kg', ...body });
  expect(res.status, await res.clone().text()).toBe(201);
}

beforeAll(async () => {
  team = await makeTeam();
  await testDb()('organisations').where({ id: team.org.id }).update({ season_start_month: 7 });
  block = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 6 });
  manager = new Client();
  await manager.signIn(team.manager.email, PASSWORD);
  const trunk = { cause: 'mechanical', severity: 'moderate', girdlingPercent: 20 };
  // The last day of season 2025, then pruning and harvest time of season 2026, then season 2027.
  await record(manager, 1, 1, 'trunk-injury', trunk, '2025-06-30T23:30:00Z');
  await record(manager, 1, 2, 'trunk-injury', trunk, '2025-07-01T00:30:00Z');
  await record(manager, 2, 3, 'pruning-record', { canesKept: 2, budsPerCane: 10, renewalSpurs: 2, pruningWeightKg: 0.9 }, '2025-08-12T09:00:00Z');
  await record(manager, 2, 4, 'trunk-injury', trunk, '2026-03-10T09:00:00Z');
  await record(manager, 2, 5, 'trunk-injury', trunk, '2026-07-02T09:00:00Z');
  await weigh(manager, { kind: 'yield', row: 2, position: 3, weight: 5.4, measuredOn: '2026-03-15' });
  await weigh(manager, { kind: 'yield', row: 2, position: 3, weight: 4.8, measuredOn: '2025-03-14' });
});

describe('seasons that start in July', () => {
  it('scope the block report from 1 July to 30 June and name it by the year it ends in', async () => {
    const res = await manager.fetch(`/api/reports/blocks/${block.id}?season=2026&compare=none`);
    expect(res.status, await res.clone().text()).toBe(200);
    const { report, seasons } = await res.json();
    expect(seasons).toEqual([2027, 2026, 2025]);
    expect(report.period).toEqual({ from: '2025-07-01T00:00:00.000Z', to: '2026-07-01T00:00:00.000Z' });
    // 1 July 2025, 12 August 2025 and 10 March 2026; not 30 June 2025 nor 2 July 2026.
    expect(report.scouting.observations).toBe(3);
    expect(report.scouting.vinesScouted).toBe(3);
  });

  it('list, export and weigh by the same season', async () => {
    const csv = await manager.fetch(`/api/reports/observations.csv?season=2026&blockId=${block.id}`);
    expect(csv.status).toBe(200);
    const rows = Papa.parse<Record<string, string>>((await csv.text()).replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true }).data;
    expect(rows.map((r) => [r.observed_at!.slice(0, 10), r.season])).toEqual([
      ['2025-07-01', '2026'],
      ['2025-08-12', '2026'],
      ['2026-03-10', '2026'],
    ]);

    const weights = await (await manager.fetch(`/api/measurements?blockId=${block.id}&season=2026`)).json();
    expect(weights.measurements.map((m: { measuredOn: string }) => m.measuredOn.slice(0, 10))).toEqual(['2026-03-15']);
    const before = await (await manager.fetch(`/api/measurements?blockId=${block.id}&season=2025`)).json();
    expect(before.measurements.map((m: { measuredOn: string }) => m.measuredOn.slice(0, 10))).toEqual(['2025-03-14']);
  });

  it('keep calendar years for an estate that starts in January', async () => {
    await testDb()('organisations').where({ id: team.org.id }).update({ season_start_month: 1 });
    try {
      const { report, seasons } = await (await manager.fetch(`/api/reports/blocks/${block.id}?season=2025&compare=none`)).json();
      expect(seasons).toEqual([2026, 2025]);
      expect(report.period).toEqual({ from: '2025-01-01T00:00:00.000Z', to: '2026-01-01T00:00:00.000Z' });
      expect(report.scouting.observations).toBe(3);
    } finally {
      await testDb()('organisations').where({ id: team.org.id }).update({ season_start_month: 7 });
    }
  });
});
