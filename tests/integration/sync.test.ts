import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

let team: Awaited<ReturnType<typeof makeTeam>>;
let block: { id: string };
let scout: Client;

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 4, vinesPerRow: 12 });
  scout = new Client();
  await scout.signIn(team.scout.email, PASSWORD);
});

const record = (over: Record<string, unknown> = {}): Record<string, unknown> & { id: string } => ({
  id: randomUUID(),
  blockId: block.id,
  row: 2,
  position: 7,
  kind: 'weak-budbreak',
  data: { budsRetained: 28, budsPushed: 15 },
  note: '',
  observedAt: '2026-10-14T08:30:00+13:00',
  ...over,
});

const sync = (client: Client, observations: unknown[]) => client.json('/api/sync', 'POST', { observations });

describe('POST /api/sync', () => {
  it('stores a new record once, with severity computed on the server, and answers "created"', async () => {
    const r = record();
    const res = await sync(scout, [r]);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ results: [{ id: r.id, status: 'created' }] });
    const stored = await testDb()('observations').where({ id: r.id });
    expect(stored).toHaveLength(1);
    expect(stored[0]).toMatchObject({ kind: 'weak-budbreak', row_number: 2, position: 7, recorded_by: team.scout.id, organisation_id: team.org.id });
    // 15 of 28 buds pushed is 53.6 %: below the default weak threshold, so not "fine".
    expect(stored[0].severity).toBeGreaterThan(0);
  });

  it('acknowledges a retry of the same record as "duplicate" and stores nothing twice', async () => {
    const r = record();
    await sync(scout, [r]);
    // Same payload, keys in another order and the time in another zone: still the same record.
    const retry = { ...r, data: { budsPushed: 15, budsRetained: 28 }, observedAt: '2026-10-13T19:30:00Z' };
    const res = await sync(scout, [retry]);
    expect((await res.json()).results).toEqual([{ id: r.id, status: 'duplicate' }]);
    expect(await testDb()('observations').where({ id: r.id }).count()).toEqual([{ count: '1' }]);
  });

  it('reports a different payload under a known id as "conflict" and keeps the stored one', async () => {
    const r = record();
    await sync(scout, [r]);
    const res = await sync(scout, [{ ...r, data: { budsRetained: 28, budsPushed: 3 } }]);
    expect((await res.json()).results).toEqual([{ id: r.id, status: 'conflict' }]);
    const stored = await testDb()('observations').where({ id: r.id }).first();
    expect(stored.data).toEqual({ budsRetained: 28, budsPushed: 15 });
  });

  it('rejects invalid records one by one, naming each bad field, and still stores the valid ones', async () => {
    const good = record();
    const bad = [
      record({ id: 'not-a-uuid' }),
      record({ kind: 'frost-cloud' }),
      record({ row: 0 }),
      record({ data: { budsRetained: 10, budsPushed: 12 } }),
      record({ data: { budsRetained: 2.5, budsPushed: 0 } }),
      record({ observedAt: 'yesterday' }),
      record({ kind: 'cane-diameter', data: { diameterMm: 'thick' } }),
      record({ position: 13 }),
      record({ note: 'x'.repeat(2001) }),
    ];
    const res = await sync(scout, [bad[0], good, ...bad.slice(1)]);
    expect(res.status).toBe(200);
    const { results } = await res.json();
    expect(results).toHaveLength(10);
    expect(results[1]).toEqual({ id: good.id, status: 'created' });
    const fields = [results[0], ...results.slice(2)].map((r: { status: string; errors: { field: string }[] }) => {
      expect(r.status).toBe('rejected');
      return r.errors.map((e) => e.field);
    });
    expect(fields).toEqual([
      ['id'],
      ['kind'],
      ['row'],
      ['data.budsPushed'],
      ['data.budsRetained'],
      ['observedAt'],
      ['data.diameterMm'],
      ['position'],
      ['note'],
    ]);
    expect(
      await testDb()('observations')
        .whereIn(
          'id',
          bad.map((b) => b.id).filter((id) => id !== 'not-a-uuid'),
        )
        .count(),
    ).toEqual([{ count: '0' }]);
  });

  it('answers 401 to a signed-out device and stores nothing', async () => {
    const r = record();
    const res = await sync(new Client(), [r]);
    expect(res.status).toBe(401);
    expect(await testDb()('observations').where({ id: r.id })).toHaveLength(0);
  });

  it('answers 403 to an advisor, who reads and comments but does not record', async () => {
    const advisor = new Client();
    await advisor.signIn(team.advisor.email, PASSWORD);
    const res = await sync(advisor, [record()]);
    expect(res.status).toBe(403);
  });

  it('refuses a vine of another organisation as if it did not exist', async () => {
    const other = await makeTeam();
    const foreign = await makeBlock(other.org.id);
    const r = record({ blockId: foreign.id, row: 1, position: 1 });
    const { results } = await (await sync(scout, [r])).json();
    expect(results).toEqual([{ id: r.id, status: 'rejected', errors: [{ field: 'blockId', message: 'No such block in your organisation' }] }]);
  });

  it('does not let another organisation overwrite or learn about a stored id', async () => {
    const r = record();
    await sync(scout, [r]);
    const other = await makeTeam();
    const otherBlock = await makeBlock(other.org.id);
    const stranger = new Client();
    await stranger.signIn(other.scout.email, PASSWORD);
    const { results } = await (await sync(stranger, [{ ...r, blockId: otherBlock.id }])).json();
    expect(results).toEqual([{ id: r.id, status: 'conflict' }]);
    expect((await testDb()('observations').where({ id: r.id }).first()).organisation_id).toBe(team.org.id);
  });

  it('rejects a record whose block id is not an id and still stores the rest of its batch', async () => {
    const bad = record({ blockId: 'not-a-block' });
    const good = record();
    const res = await sync(scout, [bad, good, record({ blockId: null })]);
    expect(res.status).toBe(200);
    const { results } = await res.json();
    expect(results.map((r: { status: string }) => r.status)).toEqual(['rejected', 'created', 'rejected']);
    expect(results[0].errors.map((e: { field: string }) => e.field)).toEqual(['blockId']);
    expect(await testDb()('observations').whereIn('id', [bad.id, good.id]).pluck('id')).toEqual([good.id]);
  });

  it('refuses a batch of 501 records as a whole with a clear message', async () => {
    const batch = Array.from({ length: 501 }, () => record());
    const res = await sync(scout, batch);
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.fields.observations[0]).toMatch(/At most 500/);
    expect(
      await testDb()('observations')
        .whereIn(
          'id',
          batch.map((b) => b.id),
        )
        .count(),
    ).toEqual([{ count: '0' }]);
  });

  it('stores a batch of 500 and answers one result per record, in order', async () => {
    const batch = Array.from({ length: 500 }, (_, i) => record({ row: (i % 4) + 1, position: (i % 12) + 1 }));
    const res = await sync(scout, batch);
    const { results } = await res.json();
    expect(results.map((r: { id: string }) => r.id)).toEqual(batch.map((b) => b.id));
    expect(new Set(results.map((r: { status: string }) => r.status))).toEqual(new Set(['created']));
  });

  it('treats the same id twice in one batch as one record', async () => {
    const r = record();
    const { results } = await (await sync(scout, [r, r, { ...r, note: 'changed' }])).json();
    expect(results.map((x: { status: string }) => x.status)).toEqual(['created', 'duplicate', 'conflict']);
  });
});
