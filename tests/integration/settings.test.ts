/**
 * Judgement settings stored per organisation and per block: a block's own setting changes its
 * report's verdict and its phone bundle, the organisation's applies to blocks without their own, only
 * managers write, another organisation sees nothing, and a bad value is refused with nothing stored.
 * Thresholds below are literals with their sources, never read back from DEFAULT_SETTINGS.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let other: Team;
let blockA: { id: string; name: string };
let blockB: { id: string; name: string };
let manager: Client;
let scout: Client;
let pruner: Client;
let advisor: Client;
let outsider: Client;
const SEASON = new Date().getUTCFullYear();

async function as(email: string) {
  const client = new Client();
  await client.signIn(email, PASSWORD);
  return client;
}

// 12 mm: under eXtension's 1/2 in (12.7 mm) bull-cane limit. 140 mm internode: inside the 5–6 in
// (127–152 mm) eXtension gives, so the default reads neither as a fault.
const THICK = { diameterMm: 12, longestInternodeMm: 100 };
const LONG = { diameterMm: 9.5, longestInternodeMm: 140 };

async function cane(blockId: string, row: number, data: object) {
  const res = await scout.json('/api/sync', 'POST', {
    observations: [
      { id: randomUUID(), blockId, row, position: 1, kind: 'cane-diameter', data, note: '', observedAt: new Date(Date.now() - 3600_000).toISOString() },
    ],
  });
  expect((await res.json()).results[0]).toMatchObject({ status: 'created' });
}

async function verdicts(blockId: string) {
  const res = await manager.fetch(`/api/reports/blocks/${blockId}?season=${SEASON}&compare=none`);
  expect(res.status, await res.clone().text()).toBe(200);
  return (await res.json()).report.canes.verdicts as Record<string, number>;
}

const stored = async () => ({
  org: await testDb()('organisation_settings').where({ organisation_id: team.org.id }).first(),
  blocks: await testDb()('block_settings').where({ organisation_id: team.org.id }).orderBy('block_id'),
});

beforeAll(async () => {
  [team, other] = await Promise.all([makeTeam(), makeTeam()]);
  blockA = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 2 });
  blockB = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 2 });
  const clients = await Promise.all([team.manager, team.scout, team.pruner, team.advisor, other.manager].map((u) => as(u.email)));
  [manager, scout, pruner, advisor, outsider] = clients as [Client, Client, Client, Client, Client];
  for (const block of [blockA, blockB]) {
    await cane(block.id, 1, THICK);
    await cane(block.id, 2, LONG);
  }
});

describe('judgement settings', () => {
  it('read the defaults with their sources until someone sets one', async () => {
    expect(await verdicts(blockA.id)).toEqual({ 'fruit-cane': 2, 'if-nothing-better': 0, remove: 0 });
    const res = await advisor.fetch(`/api/blocks/${blockA.id}/settings`);
    expect(res.status).toBe(200);
    const view = await res.json();
    const bull = view.settings.find((s: { key: string }) => s.key === 'canes.bullAboveMm');
    expect(bull).toMatchObject({ default: 12.7, value: 12.7, origin: 'default', own: null, unit: 'mm' });
    expect(bull.source).toMatch(/eXtension/);
  });

  it("change a block's report verdict and its phone bundle with the block's own setting", async () => {
    // A block that calls a cane bull above 11.5 mm and a shade cane above 127 mm (5 in, the low end of eXtension's "5-6 inches").
    const res = await manager.json(`/api/blocks/${blockA.id}/settings`, 'PUT', { overrides: { canes: { bullAboveMm: 11.5, shadeInternodeAboveMm: 127 } } });
    expect(res.status, await res.clone().text()).toBe(200);
    const view = await res.json();
    expect(view.settings.find((s: { key: string }) => s.key === 'canes.bullAboveMm')).toMatchObject({ own: 11.5, value: 11.5, origin: 'block' });
    expect(view.updatedByName).toBe(team.manager.name);
    expect(await verdicts(blockA.id)).toEqual({ 'fruit-cane': 0, 'if-nothing-better': 1, remove: 1 });
    expect(await verdicts(blockB.id)).toEqual({ 'fruit-cane': 2, 'if-nothing-better': 0, remove: 0 });

    const field = await (await scout.fetch(`/api/field/blocks/${blockA.id}`)).json();
    expect(field.settings.canes).toMatchObject({ bullAboveMm: 11.5, shadeInternodeAboveMm: 127, thinBelowMm: 7.9375 });
    const row = await testDb()('block_settings').where({ block_id: blockA.id }).first();
    expect(row).toMatchObject({
      organisation_id: team.org.id,
      updated_by: team.manager.id,
      overrides: { canes: { bullAboveMm: 11.5, shadeInternodeAboveMm: 127 } },
    });
  });

  it("apply the organisation's setting to blocks without their own", async () => {
    const res = await manager.json('/api/settings', 'PUT', { overrides: { canes: { shadeInternodeAboveMm: 130 } } });
    expect(res.status, await res.clone().text()).toBe(200);
    expect(await verdicts(blockB.id)).toEqual({ 'fruit-cane': 1, 'if-nothing-better': 1, remove: 0 });
    const b = await (await manager.fetch(`/api/blocks/${blockB.id}/settings`)).json();
    expect(b.settings.find((s: { key: string }) => s.key === 'canes.shadeInternodeAboveMm')).toMatchObject({
      value: 130,
      origin: 'organisation',
      inherited: 130,
    });
    const a = await (await manager.fetch(`/api/blocks/${blockA.id}/settings`)).json();
    expect(a.settings.find((s: { key: string }) => s.key === 'canes.shadeInternodeAboveMm')).toMatchObject({ value: 127, origin: 'block', inherited: 130 });
    expect((await (await scout.fetch(`/api/field/blocks/${blockB.id}`)).json()).settings.canes.shadeInternodeAboveMm).toBe(130);
  });

  it('let only managers change them, and no one from another organisation see them', async () => {
    const before = await stored();
    const change = { overrides: { canes: { bullAboveMm: 20 } } };
    for (const client of [scout, pruner, advisor]) {
      expect((await client.json('/api/settings', 'PUT', change)).status).toBe(403);
      expect((await client.json(`/api/blocks/${blockA.id}/settings`, 'PUT', change)).status).toBe(403);
    }
    expect((await outsider.json(`/api/blocks/${blockA.id}/settings`, 'PUT', change)).status).toBe(404);
    expect((await outsider.fetch(`/api/blocks/${blockA.id}/settings`)).status).toBe(404);
    // Their own organisation's settings are theirs alone.
    expect((await outsider.json('/api/settings', 'PUT', change)).status).toBe(200);
    expect(await stored()).toEqual(before);
    expect((await testDb()('organisation_settings').where({ organisation_id: other.org.id }).first()).overrides).toEqual(change.overrides);
  });

  it('refuse bad values with the field named, storing nothing', async () => {
    const before = await stored();
    const cases: [string, object, string][] = [
      [`/api/blocks/${blockA.id}/settings`, { canes: { bullAboveMm: -1 } }, 'overrides.canes.bullAboveMm'],
      [`/api/blocks/${blockA.id}/settings`, { canes: { bullAboveMm: 'wide' } }, 'overrides.canes.bullAboveMm'],
      [`/api/blocks/${blockA.id}/settings`, { canes: { noSuchSetting: 3 } }, 'overrides.canes'],
      [`/api/blocks/${blockA.id}/settings`, { budsPerCane: { thin: { min: 10, max: 8 } } }, 'overrides.budsPerCane.thin.max'],
      // Thin above the bull-cane limit: each value alone is a number, together they make no sense.
      [`/api/blocks/${blockA.id}/settings`, { canes: { thinBelowMm: 13 } }, 'overrides.canes.thinBelowMm'],
      ['/api/settings', { ravaz: { underBelow: 12, overAbove: 8 } }, 'overrides.ravaz.underBelow'],
      ['/api/settings', { budInjury: { minimalAbovePercent: 120 } }, 'overrides.budInjury.minimalAbovePercent'],
    ];
    for (const [path, overrides, field] of cases) {
      const res = await manager.json(path, 'PUT', { overrides });
      expect(res.status, JSON.stringify(overrides)).toBe(422);
      const body = await res.json();
      expect(body.error.code).toBe('invalid-input');
      expect(Object.keys(body.error.fields ?? {}), JSON.stringify(body)).toContain(field);
    }
    // An organisation change that block A's own setting (bull above 11.5 mm) could not live with:
    // thick from 12 mm holds under the default 12.7 mm bull limit, not under block A's.
    const res = await manager.json('/api/settings', 'PUT', { overrides: { budsPerCane: { thickFromMm: 12 } } });
    expect(res.status).toBe(422);
    expect((await res.json()).error.message).toContain(blockA.name);
    const junk = await manager.fetch('/api/settings', { method: 'PUT', headers: { 'content-type': 'application/json' }, body: '{"overrides":' });
    expect(junk.status).toBe(400);
    expect(await stored()).toEqual(before);
  });

  it('go back to the default when a setting is left out (reset)', async () => {
    const res = await manager.json(`/api/blocks/${blockA.id}/settings`, 'PUT', { overrides: { canes: { shadeInternodeAboveMm: 127 } } });
    expect(res.status).toBe(200);
    expect(await verdicts(blockA.id)).toEqual({ 'fruit-cane': 1, 'if-nothing-better': 1, remove: 0 });
    expect((await manager.json(`/api/blocks/${blockA.id}/settings`, 'PUT', { overrides: {} })).status).toBe(200);
    // Block A now inherits the organisation's 130 mm: the 140 mm internode is still a shade sign.
    expect(await verdicts(blockA.id)).toEqual({ 'fruit-cane': 1, 'if-nothing-better': 1, remove: 0 });
    expect((await manager.json('/api/settings', 'PUT', { overrides: {} })).status).toBe(200);
    expect(await verdicts(blockA.id)).toEqual({ 'fruit-cane': 2, 'if-nothing-better': 0, remove: 0 });
  });
});
