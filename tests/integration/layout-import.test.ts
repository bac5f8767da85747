import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

const fixture = (name: string) => readFileSync(path.join(__dirname, '../fixtures/layout', name), 'utf8');

async function managerWithBlock(o: { rowCount?: number; vinesPerRow?: number; firstRow?: number } = {}) {
  const team = await makeTeam();
  const client = new Client();
  await client.signIn(team.manager.email, PASSWORD);
  const res = await client.json('/api/blocks', 'POST', {
    name: `Import ${randomUUID().slice(0, 6)}`,
    variety: 'Gamay',
    plantingYear: 2012,
    clone: 'GA-1',
    rootstock: 'SO4',
    trainingSystem: 'spur',
    rowSpacingM: 2.2,
    vineSpacingM: 1,
    rowCount: o.rowCount ?? 3,
    vinesPerRow: o.vinesPerRow ?? 5,
    firstRow: o.firstRow ?? 1,
    rowOrder: 'ascending',
  });
  expect(res.status).toBe(201);
  const block = (await res.json()).block as { id: string };
  return { ...team, client, block };
}

const upload = (client: Client, blockId: string, csv: string, mode: 'preview' | 'apply') =>
  client.fetch(`/api/blocks/${blockId}/layout?mode=${mode}`, { method: 'POST', headers: { 'content-type': 'text/csv' }, body: csv });

const exportCsv = async (client: Client, blockId: string) => (await client.fetch(`/api/blocks/${blockId}/layout.csv`)).text();

/** Everything an import could touch, to prove a refused file changed nothing. */
async function snapshot(blockId: string) {
  const db = testDb();
  const [block, rows, slots, vines] = await Promise.all([
    db('blocks').where({ id: blockId }).first('row_count', 'vines_per_row', 'updated_at'),
    db('block_rows').where({ block_id: blockId }).orderBy('row_number').select('row_number', 'vine_count'),
    db('vine_positions').where({ block_id: blockId }).orderBy(['row_number', 'position']).select('id', 'row_number', 'position', 'status', 'replant_year'),
    db('vines as v').join('vine_positions as p', 'p.id', 'v.position_id').where('p.block_id', blockId).orderBy('v.id').select('v.*'),
  ]);
  return { block, rows, slots, vines };
}

describe('layout CSV import', () => {
  it('previews a good file without writing, then applies it: rows added, removed, resized and statuses set', async () => {
    const { client, block } = await managerWithBlock({ rowCount: 3, vinesPerRow: 5 });
    const csv = 'row,vines,statuses\n1,5,PPMPP\n2,7,\n';
    const before = await snapshot(block.id);

    const preview = await upload(client, block.id, csv, 'preview');
    expect(preview.status).toBe(200);
    expect((await preview.json()).summary).toEqual({
      applied: false,
      rows: { before: 3, after: 2, added: [], removed: [3], resized: [{ row: 2, from: 5, to: 7 }] },
      slots: { before: 15, after: 12, added: 2, removed: 5, statusChanged: 1 },
      statusChanges: [{ from: 'planted', to: 'missing', count: 1 }],
      after: { planted: 11, missing: 1, dead: 0, replant: 0 },
    });
    expect(await snapshot(block.id)).toEqual(before);

    const applied = await upload(client, block.id, csv, 'apply');
    expect(applied.status).toBe(200);
    expect((await applied.json()).summary.applied).toBe(true);
    expect(await exportCsv(client, block.id)).toBe('row,vines,statuses\n1,5,PPMPP\n2,7,PPPPPPP\n');
    const { block: view } = await (await client.fetch(`/api/blocks/${block.id}`)).json();
    expect(view).toMatchObject({ rowCount: 2, vinesPerRow: 7, vineCount: 12, counts: { planted: 11, missing: 1, dead: 0, replant: 0 } });
  });

  it('applies every status letter with the slot history rules, and an exported file imports into no change', async () => {
    const { client, block } = await managerWithBlock({ rowCount: 2, vinesPerRow: 4 });
    const year = new Date().getFullYear();
    expect((await upload(client, block.id, 'row,vines,statuses\r\n1,4,PMDR\r\n2,4,rrpp\r\n', 'apply')).status).toBe(200);

    const slot = async (row: number, position: number) => (await client.fetch(`/api/blocks/${block.id}/positions/${row}/${position}`)).json();
    expect(await slot(1, 4)).toEqual({
      slot: { row: 1, position: 4, status: 'replant', replantYear: year },
      vines: [
        { plantingYear: year, clone: 'GA-1', rootstock: 'SO4', removedYear: null, removalReason: null },
        { plantingYear: 2012, clone: 'GA-1', rootstock: 'SO4', removedYear: year, removalReason: 'replaced' },
      ],
    });
    expect((await slot(1, 2)).vines).toEqual([{ plantingYear: 2012, clone: 'GA-1', rootstock: 'SO4', removedYear: year, removalReason: 'missing' }]);
    expect((await slot(1, 3)).slot.status).toBe('dead');

    const exported = await exportCsv(client, block.id);
    expect(exported).toBe('row,vines,statuses\n1,4,PMDR\n2,4,RRPP\n');
    const again = await (await upload(client, block.id, exported, 'preview')).json();
    expect(again.summary).toMatchObject({
      rows: { added: [], removed: [], resized: [] },
      slots: { added: 0, removed: 0, statusChanged: 0 },
      statusChanges: [],
    });
  });

  it('accepts a file without the statuses column and keeps the statuses of the slots it keeps', async () => {
    const { client, block } = await managerWithBlock({ rowCount: 1, vinesPerRow: 3 });
    await client.json(`/api/blocks/${block.id}/positions/1/2`, 'PATCH', { status: 'dead' });
    const res = await upload(client, block.id, 'row,vines\n1,4\n2,2\n', 'apply');
    expect(res.status).toBe(200);
    expect(await exportCsv(client, block.id)).toBe('row,vines,statuses\n1,4,PDPP\n2,2,PP\n');
  });

  it('rows start at the block\u2019s first row', async () => {
    const { client, block } = await managerWithBlock({ rowCount: 2, vinesPerRow: 3, firstRow: 10 });
    expect((await upload(client, block.id, 'row,vines\n10,3\n11,3\n12,3\n', 'apply')).status).toBe(200);
    const early = await upload(client, block.id, 'row,vines\n9,3\n10,3\n', 'apply');
    expect(early.status).toBe(422);
    expect((await early.json()).error.message).toBe("Line 2: row 9 comes before the block's first row (10). Nothing was changed.");
  });

  it.each([
    ['a bad row number', 'row,vines\n1,5\nx7,5\n3,5\n', 422, { 'line 3': ['Line 3: row "x7" is not a row number (a whole number from 1).'] }],
    ['a row number of zero', 'row,vines\n0,5\n1,5\n', 422, { 'line 2': ['Line 2: row "0" is not a row number (a whole number from 1).'] }],
    ['a duplicated row', 'row,vines\n1,5\n2,5\n1,6\n', 422, { 'line 4': ['Line 4: row 1 is listed twice (also on line 2).'] }],
    ['a non-number vine count', 'row,vines\n1,5\n2,five\n', 422, { 'line 3': ['Line 3: vines "five" is not a whole number.'] }],
    [
      'a wrong header',
      'rows,vine count\n1,5\n',
      422,
      { 'line 1': ['The first line must be the header row,vines,statuses (statuses may be left out), but it is "rows,vine count".'] },
    ],
    ['an empty file', '', 422, { file: ['The file is empty. A layout file starts with the header row,vines,statuses and has one line per row.'] }],
    ['a header and nothing else', 'row,vines,statuses\n', 422, { file: ['The file has a header but no rows; a block needs at least one row.'] }],
    ['a gap in the rows', 'row,vines\n1,5\n2,5\n4,5\n', 422, { file: ["Rows must run from the block's first row (1) without gaps, but row 3 is missing."] }],
    [
      'statuses that do not match the vines',
      'row,vines,statuses\n1,3,PPX\n2,3,PP\n',
      422,
      {
        'line 2': ['Line 2: statuses may only use the letters P, M, D and R, but vine 3 is "X".'],
        'line 3': ['Line 3: there are 2 statuses for 3 vines; give one letter per vine or leave statuses empty.'],
      },
    ],
    [
      'a row longer than the limit',
      'row,vines\n1,1001\n',
      413,
      { 'line 2': ['Line 2: row 1 has 1,001 vines; a row can have at most 1,000. Nothing was changed.'] },
    ],
  ])('refuses a file with %s, says why line by line, and changes nothing', async (_what, csv, status, fields) => {
    const { client, block } = await managerWithBlock();
    const before = await snapshot(block.id);
    for (const mode of ['preview', 'apply'] as const) {
      const res = await upload(client, block.id, csv, mode);
      expect(res.status, mode).toBe(status);
      const { error } = await res.json();
      expect(error.code).toBe(status === 413 ? 'payload-too-large' : 'invalid-input');
      expect(error.fields).toEqual(fields);
      expect(error.message).toMatch(/Nothing was changed\.$/);
    }
    expect(await snapshot(block.id)).toEqual(before);
  });

  it('sums up several problems in the message and lists each line', async () => {
    const { client, block } = await managerWithBlock();
    const res = await upload(client, block.id, 'row,vines\n1,x\n2,5\n2,5\n', 'apply');
    const { error } = await res.json();
    expect(error.message).toBe('Line 2: vines "x" is not a whole number (and 1 more problem). Nothing was changed.');
    expect(Object.keys(error.fields)).toEqual(['line 2', 'line 4']);
  });

  it('refuses a 10 MB file with 413 and the size limit, and changes nothing', async () => {
    const { client, block } = await managerWithBlock();
    const before = await snapshot(block.id);
    const line = '1,5,PPPPP\n';
    const huge = 'row,vines,statuses\n' + line.repeat(Math.ceil((10 * 1024 * 1024) / line.length));
    const res = await upload(client, block.id, huge, 'apply');
    expect(res.status).toBe(413);
    expect((await res.json()).error).toEqual({
      code: 'payload-too-large',
      message: 'The file is 10 MB; a layout file can be at most 2 MB (1,000 rows of 1,000 vines). Nothing was changed.',
    });
    expect(await snapshot(block.id)).toEqual(before);
  });

  it('refuses a file of more than 1,000 rows with 413', async () => {
    const { client, block } = await managerWithBlock();
    const csv = 'row,vines\n' + Array.from({ length: 1001 }, (_, i) => `${i + 1},2`).join('\n');
    const res = await upload(client, block.id, csv, 'preview');
    expect(res.status).toBe(413);
    expect((await res.json()).error.message).toBe('The file has more than 1,000 rows; a block can have at most 1,000. Nothing was changed.');
  });

  it('refuses with 409 a layout that would remove slots with observations, and changes nothing', async () => {
    const { client, block, org } = await managerWithBlock({ rowCount: 2, vinesPerRow: 5 });
    const slot = await testDb()('vine_positions').where({ block_id: block.id, row_number: 2, position: 5 }).first('id');
    await testDb()('observations').insert({
      id: randomUUID(),
      organisation_id: org.id,
      block_id: block.id,
      position_id: slot.id,
      row_number: 2,
      position: 5,
      kind: 'note',
      data: {},
      observed_at: new Date(),
      payload_sha256: 'y'.repeat(64),
    });
    const before = await snapshot(block.id);
    for (const mode of ['preview', 'apply'] as const) {
      const res = await upload(client, block.id, 'row,vines\n1,5\n2,4\n', mode);
      expect(res.status).toBe(409);
      expect((await res.json()).error.message).toMatch(/row 2 vine 5/);
    }
    expect(await snapshot(block.id)).toEqual(before);
  });

  it('imports a 150 × 150 block with statuses in one go', async () => {
    const { client, block } = await managerWithBlock({ rowCount: 2, vinesPerRow: 2 });
    const csv = fixture('large-150x150.csv');
    const res = await upload(client, block.id, csv, 'apply');
    expect(res.status).toBe(200);
    const { summary } = await res.json();
    const letters = csv
      .split('\n')
      .slice(1)
      .filter(Boolean)
      .map((l) => l.split(',')[2]!)
      .join('');
    const count = (c: string) => [...letters].filter((l) => l === c).length;
    expect(summary.after).toEqual({ planted: count('P'), missing: count('M'), dead: count('D'), replant: count('R') });
    expect(summary.slots.after).toBe(22_500);
    expect(await testDb()('vine_positions').where({ block_id: block.id }).count<{ count: string }[]>()).toEqual([{ count: '22500' }]);
    expect(await exportCsv(client, block.id)).toBe(csv);
  });
});
