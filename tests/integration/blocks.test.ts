import { randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import type { Role } from '@/lib/roles';
import { closeTestDb, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

async function as(email: string) {
  const client = new Client();
  await client.signIn(email, PASSWORD);
  return client;
}

async function managerOf() {
  const team = await makeTeam();
  return { ...team, client: await as(team.manager.email) };
}

const form = (o: Record<string, unknown> = {}) => ({
  name: `Block ${randomUUID().slice(0, 6)}`,
  variety: 'Pinot Gris',
  clone: 'PG-2',
  rootstock: '101-14',
  plantingYear: 2016,
  trainingSystem: 'cane',
  rowSpacingM: 2.4,
  vineSpacingM: 1.2,
  rowCount: 4,
  vinesPerRow: 10,
  vinesPerPanel: 5,
  firstRow: 1,
  rowOrder: 'ascending',
  positionOrigin: 'Vine 1 at the gate end',
  rowBearingDeg: 15,
  notes: null,
  ...o,
});

async function createBlock(client: Client, o: Record<string, unknown> = {}) {
  const res = await client.json('/api/blocks', 'POST', form(o));
  expect(res.status, JSON.stringify(await res.clone().json())).toBe(201);
  return (await res.json()).block as { id: string; name: string; vineCount: number; rowCount: number };
}

/** Row number → slot count, straight from the database. */
async function slotsPerRow(blockId: string) {
  const rows = await testDb()('vine_positions')
    .where({ block_id: blockId })
    .groupBy('row_number')
    .orderBy('row_number')
    .select('row_number', testDb().raw('count(*)::int as n'));
  return Object.fromEntries(rows.map((r: { row_number: number; n: number }) => [r.row_number, r.n]));
}

async function addObservation(orgId: string, blockId: string, row: number, position: number) {
  const slot = await testDb()('vine_positions').where({ block_id: blockId, row_number: row, position }).first('id');
  await testDb()('observations').insert({
    id: randomUUID(),
    organisation_id: orgId,
    block_id: blockId,
    position_id: slot.id,
    row_number: row,
    position,
    kind: 'note',
    data: {},
    observed_at: new Date(),
    payload_sha256: 'x'.repeat(64),
  });
}

describe('blocks through the route handlers', () => {
  it('a manager creates a block: every row gets its planting slots, each with a vine, and the list shows it with its counts', async () => {
    const { client } = await managerOf();
    const block = await createBlock(client, { rowCount: 4, vinesPerRow: 10 });
    expect(block).toMatchObject({ rowCount: 4, vineCount: 40 });

    expect(await slotsPerRow(block.id)).toEqual({ 1: 10, 2: 10, 3: 10, 4: 10 });
    const vines = await testDb()('vines as v')
      .join('vine_positions as p', 'p.id', 'v.position_id')
      .where('p.block_id', block.id)
      .select('v.planting_year', 'v.clone', 'v.removed_year');
    expect(vines).toHaveLength(40);
    expect(
      vines.every(
        (v: { planting_year: number; clone: string; removed_year: null }) => v.planting_year === 2016 && v.clone === 'PG-2' && v.removed_year === null,
      ),
    ).toBe(true);

    const { blocks } = await (await client.fetch('/api/blocks')).json();
    expect(blocks).toEqual([
      expect.objectContaining({
        id: block.id,
        name: block.name,
        variety: 'Pinot Gris',
        trainingSystem: 'cane',
        rowCount: 4,
        vineCount: 40,
        rowSpacingM: 2.4,
        vineSpacingM: 1.2,
        vinesPerPanel: 5,
        firstRow: 1,
        rowOrder: 'ascending',
        positionOrigin: 'Vine 1 at the gate end',
        counts: { planted: 40, missing: 0, dead: 0, replant: 0 },
        areaM2: expect.closeTo(40 * 2.4 * 1.2, 6),
        // lib/viticulture: 10 000 / (2.4 × 1.2).
        vinesPerHa: expect.closeTo(3472.22, 1),
      }),
    ]);
  });

  it('more rows add slots at the end, fewer rows remove them, and a new default resizes only rows without an override', async () => {
    const { client } = await managerOf();
    const block = await createBlock(client, { rowCount: 3, vinesPerRow: 10 });
    expect((await client.json(`/api/blocks/${block.id}/rows/2`, 'PATCH', { vineCount: 7 })).status).toBe(200);
    expect(await slotsPerRow(block.id)).toEqual({ 1: 10, 2: 7, 3: 10 });

    const grown = await client.json(`/api/blocks/${block.id}`, 'PATCH', { rowCount: 5, vinesPerRow: 12 });
    expect(grown.status).toBe(200);
    expect((await grown.json()).block).toMatchObject({ rowCount: 5, vinesPerRow: 12, vineCount: 12 + 7 + 12 + 12 + 12 });
    expect(await slotsPerRow(block.id)).toEqual({ 1: 12, 2: 7, 3: 12, 4: 12, 5: 12 });

    const shrunk = await client.json(`/api/blocks/${block.id}`, 'PATCH', { rowCount: 2 });
    expect((await shrunk.json()).block).toMatchObject({ rowCount: 2, vineCount: 19 });
    expect(await slotsPerRow(block.id)).toEqual({ 1: 12, 2: 7 });
    expect(await testDb()('block_rows').where({ block_id: block.id }).count<{ count: string }[]>()).toEqual([{ count: '2' }]);
  });

  it('refuses with 409 to remove slots that have observations, and changes nothing', async () => {
    const { client, org } = await managerOf();
    const block = await createBlock(client, { rowCount: 3, vinesPerRow: 10 });
    await addObservation(org.id, block.id, 3, 4);

    const fewerRows = await client.json(`/api/blocks/${block.id}`, 'PATCH', { rowCount: 2 });
    expect(fewerRows.status).toBe(409);
    expect((await fewerRows.json()).error.message).toMatch(/remove 1 planting slot that has observations \(row 3 vine 4\)/);

    const shorterRow = await client.json(`/api/blocks/${block.id}/rows/3`, 'PATCH', { vineCount: 3 });
    expect(shorterRow.status).toBe(409);
    expect(await slotsPerRow(block.id)).toEqual({ 1: 10, 2: 10, 3: 10 });

    // Shortening past the observed vine is fine.
    expect((await client.json(`/api/blocks/${block.id}/rows/3`, 'PATCH', { vineCount: 4 })).status).toBe(200);
    expect(await slotsPerRow(block.id)).toEqual({ 1: 10, 2: 10, 3: 4 });
  });

  it('refuses to remove a slot that carries a flag too, naming the kind of record, and refuses renumbering its rows', async () => {
    const { client, org } = await managerOf();
    const block = await createBlock(client, { rowCount: 2, vinesPerRow: 6 });
    const slot = await testDb()('vine_positions').where({ block_id: block.id, row_number: 2, position: 6 }).first('id');
    await testDb()('flags').insert({
      id: randomUUID(),
      organisation_id: org.id,
      block_id: block.id,
      position_id: slot.id,
      row_number: 2,
      position: 6,
      to_position: 6,
      reason: 'replant',
      flagged_at: new Date(),
      payload_sha256: 'f'.repeat(64),
    });
    const shorter = await client.json(`/api/blocks/${block.id}/rows/2`, 'PATCH', { vineCount: 5 });
    expect(shorter.status).toBe(409);
    expect((await shorter.json()).error.message).toMatch(/remove 1 planting slot that has flags \(row 2 vine 6\)/);
    expect((await client.json(`/api/blocks/${block.id}`, 'PATCH', { firstRow: 3 })).status).toBe(409);
    expect(await slotsPerRow(block.id)).toEqual({ 1: 6, 2: 6 });
    expect(await testDb()('flags').where({ position_id: slot.id })).toHaveLength(1);
  });

  it('a new first row renumbers the rows and their slots, until the field has used the numbers', async () => {
    const { client, org } = await managerOf();
    const block = await createBlock(client, { rowCount: 3, vinesPerRow: 4 });
    await client.json(`/api/blocks/${block.id}/positions/2/3`, 'PATCH', { status: 'missing', year: 2025 });

    const res = await client.json(`/api/blocks/${block.id}`, 'PATCH', { firstRow: 11 });
    expect(res.status).toBe(200);
    expect(await slotsPerRow(block.id)).toEqual({ 11: 4, 12: 4, 13: 4 });
    const moved = await (await client.fetch(`/api/blocks/${block.id}/positions?row=12`)).json();
    expect(moved.positions.map((p: { status: string }) => p.status)).toEqual(['planted', 'planted', 'missing', 'planted']);

    await addObservation(org.id, block.id, 11, 1);
    const refused = await client.json(`/api/blocks/${block.id}`, 'PATCH', { firstRow: 1 });
    expect(refused.status).toBe(409);
    expect((await refused.json()).error.fields).toHaveProperty('firstRow');
    expect(await slotsPerRow(block.id)).toEqual({ 11: 4, 12: 4, 13: 4 });
  });

  it('archiving hides a block from the list unless archived ones are asked for, and restoring brings it back', async () => {
    const { client } = await managerOf();
    const block = await createBlock(client);
    const archived = await client.fetch(`/api/blocks/${block.id}/archive`, { method: 'POST' });
    expect(archived.status).toBe(200);
    expect((await archived.json()).block.archivedAt).toEqual(expect.any(String));

    expect((await (await client.fetch('/api/blocks')).json()).blocks).toEqual([]);
    const all = (await (await client.fetch('/api/blocks?archived=1')).json()).blocks;
    expect(all.map((b: { id: string }) => b.id)).toEqual([block.id]);

    const edit = await client.json(`/api/blocks/${block.id}`, 'PATCH', { variety: 'Riesling' });
    expect(edit.status).toBe(409);
    expect((await edit.json()).error.message).toMatch(/archived/);

    expect((await client.fetch(`/api/blocks/${block.id}/restore`, { method: 'POST' })).status).toBe(200);
    expect((await (await client.fetch('/api/blocks')).json()).blocks.map((b: { id: string }) => b.id)).toEqual([block.id]);
  });

  it('two active blocks cannot share a name: 409 on the name field', async () => {
    const { client } = await managerOf();
    const first = await createBlock(client, { name: 'Long Paddock' });
    const again = await client.json('/api/blocks', 'POST', form({ name: 'long paddock' }));
    expect(again.status).toBe(409);
    expect((await again.json()).error.fields).toEqual({ name: ['Another block has this name'] });

    await client.fetch(`/api/blocks/${first.id}/archive`, { method: 'POST' });
    expect((await client.json('/api/blocks', 'POST', form({ name: 'Long Paddock' }))).status).toBe(201);
    expect((await client.fetch(`/api/blocks/${first.id}/restore`, { method: 'POST' })).status).toBe(409);
  });

  it('answers bad fields with 422, field by field, and creates nothing', async () => {
    const { client, org } = await managerOf();
    const res = await client.json(
      '/api/blocks',
      'POST',
      form({ name: '', trainingSystem: 'sprawl', rowSpacingM: 0, vineSpacingM: 'wide', rowCount: 2.5, vinesPerRow: 1001, firstRow: 0, plantingYear: 1700 }),
    );
    expect(res.status).toBe(422);
    const { error } = await res.json();
    expect(error.code).toBe('invalid-input');
    expect(Object.keys(error.fields).sort()).toEqual([
      'firstRow',
      'name',
      'plantingYear',
      'rowCount',
      'rowSpacingM',
      'trainingSystem',
      'vineSpacingM',
      'vinesPerRow',
    ]);
    expect(error.fields.name).toEqual(['Give the block a name']);
    expect(error.fields.vinesPerRow).toEqual(['A row has between 1 and 1000 vines']);
    expect(await testDb()('blocks').where({ organisation_id: org.id })).toEqual([]);

    const patch = await client.json('/api/blocks/' + (await createBlock(client)).id, 'PATCH', { rowOrder: 'sideways' });
    expect(patch.status).toBe(422);
    expect(Object.keys((await patch.json()).error.fields)).toEqual(['rowOrder']);
  });

  it('a replant closes the old vine and plants a new one in the same slot, which keeps the history', async () => {
    const { client } = await managerOf();
    const block = await createBlock(client, { rowCount: 2, vinesPerRow: 6 });
    const url = `/api/blocks/${block.id}/positions/2/4`;

    const missing = await client.json(url, 'PATCH', { status: 'missing', year: 2023 });
    expect(missing.status).toBe(200);
    const replant = await client.json(url, 'PATCH', { status: 'replant', year: 2024, clone: 'PG-52' });
    expect(replant.status).toBe(200);
    expect(await replant.json()).toEqual({
      slot: { row: 2, position: 4, status: 'replant', replantYear: 2024 },
      vines: [
        { plantingYear: 2024, clone: 'PG-52', rootstock: '101-14', removedYear: null, removalReason: null },
        { plantingYear: 2016, clone: 'PG-2', rootstock: '101-14', removedYear: 2023, removalReason: 'missing' },
      ],
    });

    const dead = await (await client.json(url, 'PATCH', { status: 'dead', year: 2025 })).json();
    expect(dead.vines.map((v: { removedYear: number | null }) => v.removedYear)).toEqual([2025, 2023]);

    const noYear = await client.json(url, 'PATCH', { status: 'replant' });
    expect(noYear.status).toBe(422);
    expect((await noYear.json()).error.fields).toEqual({ year: ['Enter the year of the replant'] });

    const { block: after } = await (await client.fetch(`/api/blocks/${block.id}`)).json();
    expect(after.counts).toEqual({ planted: 11, missing: 0, dead: 1, replant: 0 });
  });

  it('marking a missing vine planted again reopens the vine that stood there instead of inventing one', async () => {
    const { client } = await managerOf();
    const block = await createBlock(client, { rowCount: 1, vinesPerRow: 3 });
    const url = `/api/blocks/${block.id}/positions/1/2`;
    await client.json(url, 'PATCH', { status: 'missing', year: 2025 });
    const back = await (await client.json(url, 'PATCH', { status: 'planted' })).json();
    expect(back).toEqual({
      slot: { row: 1, position: 2, status: 'planted', replantYear: null },
      vines: [{ plantingYear: 2016, clone: 'PG-2', rootstock: '101-14', removedYear: null, removalReason: null }],
    });
  });

  it('lists the slots of one row with their status for every role, and 404s a row the block does not have', async () => {
    const team = await makeTeam();
    const manager = await as(team.manager.email);
    const block = await createBlock(manager, { rowCount: 2, vinesPerRow: 5 });
    await manager.json(`/api/blocks/${block.id}/positions/2/5`, 'PATCH', { status: 'dead' });
    for (const role of ['manager', 'scout', 'pruner', 'advisor'] as const) {
      const client = role === 'manager' ? manager : await as(team[role].email);
      const res = await client.fetch(`/api/blocks/${block.id}/positions?row=2`);
      expect(res.status, role).toBe(200);
      const body = await res.json();
      expect(body.vinesPerPanel).toBe(5);
      expect(body.positions.map((p: { position: number; status: string }) => `${p.position}:${p.status}`)).toEqual([
        '1:planted',
        '2:planted',
        '3:planted',
        '4:planted',
        '5:dead',
      ]);
    }
    expect((await manager.fetch(`/api/blocks/${block.id}/positions?row=3`)).status).toBe(404);
    expect((await manager.fetch(`/api/blocks/${block.id}/positions?row=two`)).status).toBe(404);
  });

  it.each<Exclude<Role, 'manager'>>(['scout', 'pruner', 'advisor'])('a %s reads blocks but every write answers 403 and changes nothing', async (role) => {
    const team = await makeTeam();
    const block = await createBlock(await as(team.manager.email), { rowCount: 2, vinesPerRow: 4 });
    const client = await as(team[role].email);

    expect((await client.fetch('/api/blocks')).status).toBe(200);
    expect((await client.fetch(`/api/blocks/${block.id}`)).status).toBe(200);
    expect((await client.fetch(`/api/blocks/${block.id}/layout.csv`)).status).toBe(200);

    const writes: [string, string, unknown][] = [
      ['/api/blocks', 'POST', form()],
      [`/api/blocks/${block.id}`, 'PATCH', { rowCount: 1 }],
      [`/api/blocks/${block.id}/archive`, 'POST', undefined],
      [`/api/blocks/${block.id}/restore`, 'POST', undefined],
      [`/api/blocks/${block.id}/rows/1`, 'PATCH', { vineCount: 1 }],
      [`/api/blocks/${block.id}/positions/1/1`, 'PATCH', { status: 'missing' }],
    ];
    for (const [path, method, body] of writes) {
      const res = await client.json(path, method, body);
      expect(res.status, `${method} ${path}`).toBe(403);
      expect((await res.json()).error.code).toBe('forbidden');
    }
    const layout = await client.fetch(`/api/blocks/${block.id}/layout?mode=apply`, {
      method: 'POST',
      headers: { 'content-type': 'text/csv' },
      body: 'row,vines\n1,1\n',
    });
    expect(layout.status).toBe(403);
    expect(await slotsPerRow(block.id)).toEqual({ 1: 4, 2: 4 });
    expect(await testDb()('blocks').where({ organisation_id: team.org.id }).count<{ count: string }[]>()).toEqual([{ count: '1' }]);
  });

  it("another organisation's block is invisible: 404 on every route, never its data", async () => {
    const a = await managerOf();
    const b = await managerOf();
    const theirs = await createBlock(b.client, { name: 'Their Block' });

    expect((await (await a.client.fetch('/api/blocks?archived=1')).json()).blocks).toEqual([]);
    const attempts: [string, string, unknown][] = [
      [`/api/blocks/${theirs.id}`, 'GET', undefined],
      [`/api/blocks/${theirs.id}`, 'PATCH', { name: 'Mine now' }],
      [`/api/blocks/${theirs.id}/archive`, 'POST', undefined],
      [`/api/blocks/${theirs.id}/rows/1`, 'PATCH', { vineCount: 2 }],
      [`/api/blocks/${theirs.id}/positions?row=1`, 'GET', undefined],
      [`/api/blocks/${theirs.id}/positions/1/1`, 'GET', undefined],
      [`/api/blocks/${theirs.id}/positions/1/1`, 'PATCH', { status: 'dead' }],
      [`/api/blocks/${theirs.id}/layout.csv`, 'GET', undefined],
    ];
    for (const [path, method, body] of attempts) {
      const res = await a.client.json(path, method, body);
      expect(res.status, `${method} ${path}`).toBe(404);
      const text = await res.text();
      expect(text).not.toContain('Their Block');
      expect(JSON.parse(text).error.code).toBe('not-found');
    }
    const layout = await a.client.fetch(`/api/blocks/${theirs.id}/layout?mode=apply`, {
      method: 'POST',
      headers: { 'content-type': 'text/csv' },
      body: 'row,vines\n1,1\n',
    });
    expect(layout.status).toBe(404);
    const still = await testDb()('blocks').where({ id: theirs.id }).first();
    expect(still).toMatchObject({ name: 'Their Block', archived_at: null, row_count: 4 });
    // An id that cannot be one is a bad request (422, naming it), not a missing block.
    const bad = await a.client.fetch('/api/blocks/not-a-uuid');
    expect(bad.status).toBe(422);
    expect(Object.keys((await bad.json()).error.fields)).toEqual(['id']);
  });

  it('answers 401 to a signed-out caller', async () => {
    const res = await new Client().fetch('/api/blocks');
    expect(res.status).toBe(401);
    expect((await res.json()).error.code).toBe('unauthenticated');
  });
});
