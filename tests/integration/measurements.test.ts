import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let block: { id: string };
const clients: Record<'manager' | 'scout' | 'pruner' | 'advisor', Client> = {} as never;

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 8 });
  for (const role of ['manager', 'scout', 'pruner', 'advisor'] as const) {
    clients[role] = new Client();
    await clients[role].signIn(team[role].email, PASSWORD);
  }
});

const entry = (over: object = {}) => ({
  blockId: block.id,
  kind: 'yield',
  row: 1,
  position: 3,
  weight: 5.5,
  weightUnit: 'kg',
  clusters: 44,
  measuredOn: '2024-09-18',
  ...over,
});

describe('POST /api/measurements', () => {
  it('stores a vine’s yield on its slot, and a row sample without one', async () => {
    const res = await clients.scout.json('/api/measurements', 'POST', entry({ note: 'Picked with the crew' }));
    expect(res.status).toBe(201);
    const { measurement } = await res.json();
    expect(measurement).toMatchObject({
      kind: 'yield',
      row: 1,
      position: 3,
      vines: 1,
      weightKg: 5.5,
      clusters: 44,
      measuredOn: '2024-09-18',
      note: 'Picked with the crew',
      recordedBy: team.scout.id,
    });
    const stored = await testDb()('measurements').where({ id: measurement.id }).first();
    const slot = await testDb()('vine_positions').where({ block_id: block.id, row_number: 1, position: 3 }).first('id');
    expect(stored.position_id).toBe(slot.id);
    expect(stored.organisation_id).toBe(team.org.id);

    const sample = await clients.pruner.json(
      '/api/measurements',
      'POST',
      entry({ kind: 'pruning-weight', row: 2, position: null, vines: 8, weight: 15, weightUnit: 'lb', clusters: null, measuredOn: '2025-01-20' }),
    );
    expect(sample.status).toBe(201);
    const body = await sample.json();
    expect(body.measurement).toMatchObject({ position: null, vines: 8, clusters: null });
    // Pounds are stored as kilograms (1 lb = 0.45359237 kg), to the gram.
    expect(body.measurement.weightKg).toBeCloseTo(15 * 0.45359237, 3);
  });

  it('answers 422 field by field for entries that cannot be right, and stores none of them', async () => {
    const before = await testDb()('measurements').where({ block_id: block.id }).count<{ count: string }[]>();
    for (const [over, field] of [
      [{ weight: -1 }, 'weight'],
      [{ weight: 80 }, 'weight'], // 80 kg from one vine: a unit slip
      [{ kind: 'pruning-weight', weight: 0, clusters: null }, 'weight'],
      [{ kind: 'pruning-weight', weight: 1 }, 'clusters'],
      [{ vines: 5 }, 'vines'], // one vine is one vine
      [{ measuredOn: '2999-01-01' }, 'measuredOn'],
      [{ measuredOn: 'yesterday' }, 'measuredOn'],
      [{ kind: 'sugar' }, 'kind'],
      [{ weightUnit: 'stone' }, 'weightUnit'],
      [{ row: 1.5 }, 'row'],
      [{ position: 9 }, 'position'], // the row has 8 vines
      [{ position: null, row: 7, vines: 4 }, 'row'], // the block has 2 rows
    ] as const) {
      const res = await clients.manager.json('/api/measurements', 'POST', entry(over));
      expect(res.status, JSON.stringify(over)).toBe(422);
      const { error } = await res.json();
      expect(Object.keys(error.fields), JSON.stringify(over)).toEqual([field]);
    }
    const after = await testDb()('measurements').where({ block_id: block.id }).count<{ count: string }[]>();
    expect(after[0]!.count).toBe(before[0]!.count);
  });

  it('keeps advisors to reading, strangers out, and another organisation’s block not found', async () => {
    expect((await clients.advisor.json('/api/measurements', 'POST', entry())).status).toBe(403);
    expect((await new Client().json('/api/measurements', 'POST', entry())).status).toBe(401);
    const other = await makeTeam();
    const otherBlock = await makeBlock(other.org.id);
    const res = await clients.manager.json('/api/measurements', 'POST', entry({ blockId: otherBlock.id }));
    expect(res.status).toBe(404);
    expect((await clients.manager.fetch(`/api/measurements?blockId=${otherBlock.id}&season=2024`)).status).toBe(404);
  });
});

describe('GET and DELETE /api/measurements', () => {
  it('lists a block’s weights of one season, newest first, for every role', async () => {
    const res = await clients.advisor.fetch(`/api/measurements?blockId=${block.id}&season=2024`);
    expect(res.status).toBe(200);
    const { measurements } = await res.json();
    expect(measurements.map((m: { measuredOn: string }) => m.measuredOn)).toEqual(['2024-09-18']);
    expect((await clients.advisor.fetch(`/api/measurements?blockId=${block.id}&season=soon`)).status).toBe(422);
  });

  it('lets the person who entered a weight or a manager remove it, and nobody else', async () => {
    const made = await (await clients.scout.json('/api/measurements', 'POST', entry({ position: 5, measuredOn: '2024-09-19' }))).json();
    const id = made.measurement.id;
    expect((await clients.pruner.fetch(`/api/measurements/${id}`, { method: 'DELETE' })).status).toBe(403);
    expect((await clients.advisor.fetch(`/api/measurements/${id}`, { method: 'DELETE' })).status).toBe(403);
    expect((await clients.scout.fetch(`/api/measurements/${id}`, { method: 'DELETE' })).status).toBe(204);
    expect((await clients.scout.fetch(`/api/measurements/${id}`, { method: 'DELETE' })).status).toBe(404);

    const other = await (await clients.pruner.json('/api/measurements', 'POST', entry({ position: 6, measuredOn: '2024-09-19' }))).json();
    expect((await clients.manager.fetch(`/api/measurements/${other.measurement.id}`, { method: 'DELETE' })).status).toBe(204);
    expect(await testDb()('measurements').whereIn('id', [id, other.measurement.id]).count<{ count: string }[]>()).toEqual([{ count: '0' }]);
  });

  it('never removes another organisation’s entry', async () => {
    const other = await makeTeam();
    const otherBlock = await makeBlock(other.org.id);
    const [row] = await testDb()('measurements')
      .insert({ organisation_id: other.org.id, block_id: otherBlock.id, kind: 'yield', row_number: 1, vines: 3, weight_kg: 9, measured_on: '2024-09-01' })
      .returning('id');
    expect((await clients.manager.fetch(`/api/measurements/${row.id}`, { method: 'DELETE' })).status).toBe(404);
    expect(await testDb()('measurements').where({ id: row.id }).count<{ count: string }[]>()).toEqual([{ count: '1' }]);
  });
});
