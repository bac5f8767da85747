import { randomUUID } from 'node:crypto';
import { PutObjectCommand } from '@aws-sdk/client-s3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sweepPendingPhotos } from '@/lib/server/services/photos';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';
import { objectExists, testS3 } from '../helpers/s3';

afterAll(closeTestDb);

let team: Awaited<ReturnType<typeof makeTeam>>;
let block: { id: string };
const clients: Record<string, Client> = {};

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 3, vinesPerRow: 8 });
  for (const role of ['manager', 'scout', 'pruner', 'advisor'] as const) {
    clients[role] = new Client();
    await clients[role].signIn(team[role].email, PASSWORD);
  }
});

describe('the field layout a phone keeps for offline walking', () => {
  it('gives one status letter per slot per row and the worst open finding of each vine', async () => {
    await testDb()('vine_positions').where({ block_id: block.id, row_number: 2, position: 3 }).update({ status: 'missing' });
    await testDb()('vine_positions').where({ block_id: block.id, row_number: 2, position: 5 }).update({ status: 'replant', replant_year: 2025 });
    const records = [
      { kind: 'trunk-injury', data: { cause: 'cold', severity: 'severe', girdlingPercent: 80 }, position: 4 },
      { kind: 'note', data: {}, position: 4 },
      { kind: 'weak-budbreak', data: { budsRetained: 30, budsPushed: 29 }, position: 6 },
    ].map((r) => ({ id: randomUUID(), blockId: block.id, row: 2, note: '', observedAt: new Date().toISOString(), ...r }));
    await clients.scout!.json('/api/sync', 'POST', { observations: records });

    const res = await clients.advisor!.fetch(`/api/field/blocks/${block.id}`);
    expect(res.status).toBe(200);
    const layout = await res.json();
    expect(layout.block).toMatchObject({ id: block.id, vinesPerPanel: 5, rowCount: 3, unitSystem: 'metric' });
    expect(layout.rows).toEqual([
      { row: 1, vineCount: 8, statuses: 'PPPPPPPP' },
      { row: 2, vineCount: 8, statuses: 'PPMPRPPP' },
      { row: 3, vineCount: 8, statuses: 'PPPPPPPP' },
    ]);
    // Severe trunk injury girdling 80% is urgent (3); a note is fine (0) and so is 29 of 30 buds
    // pushed (0): only vines with an open finding above "fine" are listed, with their count.
    expect(layout.findings).toEqual([[2, 4, 3, 1]]);
  });

  it('answers 404 for a block of another organisation and 422 for an id that is not one', async () => {
    const other = await makeTeam();
    const foreign = await makeBlock(other.org.id);
    expect((await clients.scout!.fetch(`/api/field/blocks/${foreign.id}`)).status).toBe(404);
    expect((await clients.scout!.fetch(`/api/field/blocks/not-a-uuid`)).status).toBe(422);
  });
});

describe('sprays and the re-entry warning', () => {
  it('lets only a manager record a spray, and shows its re-entry time on the field layout', async () => {
    const appliedAt = new Date(Date.now() - 2 * 3600 * 1000).toISOString();
    const spray = { blockId: block.id, product: 'Example Fungicide 40 WG', appliedAt, reiHours: 12 };
    for (const role of ['scout', 'pruner', 'advisor']) {
      expect((await clients[role]!.json('/api/sprays', 'POST', spray)).status, role).toBe(403);
    }
    expect((await clients.manager!.json('/api/sprays', 'POST', spray)).status).toBe(201);

    const layout = await (await clients.scout!.fetch(`/api/field/blocks/${block.id}`)).json();
    expect(layout.sprays).toHaveLength(1);
    expect(layout.sprays[0].product).toBe('Example Fungicide 40 WG');
    expect(Date.parse(layout.sprays[0].reentryAt) - Date.parse(appliedAt)).toBe(12 * 3600 * 1000);
  });

  it("refuses a spray without a re-entry interval or on another organisation's block", async () => {
    const missing = await clients.manager!.json('/api/sprays', 'POST', { blockId: block.id, product: 'X', appliedAt: new Date().toISOString() });
    expect(missing.status).toBe(422);
    expect(Object.keys((await missing.json()).error.fields).sort()).toEqual(['product', 'reiHours']);
    const other = await makeTeam();
    const foreign = await makeBlock(other.org.id);
    const res = await clients.manager!.json('/api/sprays', 'POST', {
      blockId: foreign.id,
      product: 'Example',
      appliedAt: new Date().toISOString(),
      reiHours: 4,
    });
    expect(res.status).toBe(404);
  });
});

describe('sampling plans', () => {
  it('are drawn by managers and advisors, skip missing slots, and repeat exactly from their seed', async () => {
    expect((await clients.scout!.json('/api/sampling-plans', 'POST', { blockId: block.id, name: 'Nope', count: 5 })).status).toBe(403);
    const body = { blockId: block.id, name: 'Budbreak check', count: 10, seed: 1234, avoidRowEnds: 1 };
    const first = await clients.advisor!.json('/api/sampling-plans', 'POST', body);
    expect(first.status).toBe(201);
    const a = (await first.json()).plan;
    const b = (await (await clients.manager!.json('/api/sampling-plans', 'POST', body)).json()).plan;
    expect(a.addresses).toHaveLength(10);
    expect(b.addresses).toEqual(a.addresses);
    for (const v of a.addresses) {
      expect(v.position).toBeGreaterThanOrEqual(2);
      expect(v.position).toBeLessThanOrEqual(7);
      expect(v).not.toEqual({ row: 2, position: 3 });
    }
    const layout = await (await clients.scout!.fetch(`/api/field/blocks/${block.id}`)).json();
    expect(layout.plans.map((p: { name: string }) => p.name)).toContain('Budbreak check');
  });
});

describe('language', () => {
  it("is kept on the person's account and mirrored in a cookie", async () => {
    const res = await clients.pruner!.json('/api/me/locale', 'PUT', { locale: 'es' });
    expect(res.status).toBe(200);
    expect(clients.pruner!.cookie('vw-locale')).toBe('es');
    expect((await testDb()('users').where({ id: team.pruner.id }).first()).locale).toBe('es');
    expect((await clients.pruner!.json('/api/me/locale', 'PUT', { locale: 'fr' })).status).toBe(422);
  });
});

describe('unconfirmed uploads', () => {
  it('are swept after a week: the pending row and the object are removed, stored photos stay', async () => {
    const observationId = randomUUID();
    await clients.scout!.json('/api/sync', 'POST', {
      observations: [
        { id: observationId, blockId: block.id, row: 1, position: 1, kind: 'note', data: {}, note: 'sweep', observedAt: new Date().toISOString() },
      ],
    });
    const stale = randomUUID();
    const key = `orgs/${team.org.id}/photos/${stale}.jpg`;
    await testDb()('photos').insert({
      id: stale,
      organisation_id: team.org.id,
      observation_id: observationId,
      object_key: key,
      created_at: new Date(Date.now() - 8 * 24 * 3600 * 1000),
    });
    await testS3().send(new PutObjectCommand({ Bucket: process.env.S3_BUCKET!, Key: key, Body: 'half an upload' }));
    const fresh = randomUUID();
    await testDb()('photos').insert({
      id: fresh,
      organisation_id: team.org.id,
      observation_id: observationId,
      object_key: `orgs/${team.org.id}/photos/${fresh}.jpg`,
    });

    expect(await sweepPendingPhotos()).toBeGreaterThanOrEqual(1);
    expect(await testDb()('photos').where({ id: stale })).toHaveLength(0);
    expect(await objectExists(key)).toBe(false);
    expect(await testDb()('photos').where({ id: fresh })).toHaveLength(1);
  });
});
