import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSV_COLUMNS } from '@/lib/reports/csv';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let block: { id: string; name: string };
let manager: Client;

const NOTES = {
  comma: 'Cold pocket, low end',
  quotes: 'Pruner said "leave two spurs"',
  lines: 'First line\nsecond line, with "both"\r\nthird',
  formula: '=HYPERLINK("http://example.com")',
};

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 5, name: `Export, "quoted" ${randomUUID().slice(0, 4)}` });
  manager = new Client();
  await manager.signIn(team.manager.email, PASSWORD);
  const observations = Object.entries(NOTES).map(([key, note], i) => ({
    id: randomUUID(),
    blockId: block.id,
    row: 1,
    position: i + 1,
    kind: 'weak-budbreak',
    data: { budsRetained: 28, budsPushed: 20 + i },
    note,
    observedAt: `2024-04-2${i}T09:00:00Z`,
    key,
  }));
  const res = await manager.json('/api/sync', 'POST', { observations: observations.map(({ key: _key, ...o }) => o) });
  expect((await res.json()).results.map((r: { status: string }) => r.status)).toEqual(['created', 'created', 'created', 'created']);
});

async function download(query: string) {
  const res = await manager.fetch(`/api/reports/observations.csv?${query}`);
  expect(res.status, query).toBe(200);
  return { res, text: await res.text() };
}

describe('GET /api/reports/observations.csv', () => {
  it('starts with the documented columns, in order, as an attachment', async () => {
    const { res, text } = await download(`season=2024&blockId=${block.id}`);
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="vineward-observations-export-quoted-[a-z0-9-]+-2024\.csv"$/);
    const header = text.replace(/^\uFEFF/, '').split('\r\n')[0];
    expect(header).toBe(
      'observation_id,season,block_id,block_name,row,position,kind,severity,status,observed_at,closed_at,recorded_by,note,' +
        'diameter_mm,longest_internode_mm,exposure,buds_retained,buds_pushed,budbreak_percent,buds_cut,primaries_dead,primary_kill_percent,' +
        'canes_kept,buds_per_cane,renewal_spurs,pruning_weight_kg,bud_target,data_json',
    );
    expect(header!.split(',')).toEqual([...CSV_COLUMNS]);
  });

  it('quotes commas, quotes and line breaks in notes so every record reads back as typed', async () => {
    const { text } = await download(`season=2024&blockId=${block.id}`);
    expect(text).toContain('"Cold pocket, low end"');
    expect(text).toContain('"Pruner said ""leave two spurs"""');
    expect(text).toContain('"First line\nsecond line, with ""both""\r\nthird"');
    const rows = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true }).data;
    expect(rows.map((r) => r.note)).toEqual([NOTES.comma, NOTES.quotes, NOTES.lines, `'${NOTES.formula}`]);
    expect(rows.every((r) => r.block_name === block.name && r.season === '2024' && r.kind === 'weak-budbreak')).toBe(true);
    expect(rows.map((r) => r.budbreak_percent)).toEqual(['71.43', '75', '78.57', '82.14']);
    expect(rows[0]!.recorded_by).toBe(team.manager.name);
  });

  it('leaves out other seasons, other blocks, deleted records and other organisations', async () => {
    const db = testDb();
    const otherBlock = await makeBlock(team.org.id, { rows: 1, vinesPerRow: 2 });
    const stranger = await makeTeam();
    const strangerBlock = await makeBlock(stranger.org.id, { rows: 1, vinesPerRow: 2 });
    const slot = async (blockId: string) => (await db('vine_positions').where({ block_id: blockId }).first('id', 'row_number', 'position'))!;
    const insert = async (organisationId: string, blockId: string, observedAt: string, deleted = false) => {
      const s = await slot(blockId);
      await db('observations').insert({
        id: randomUUID(),
        organisation_id: organisationId,
        block_id: blockId,
        position_id: s.id,
        row_number: s.row_number,
        position: s.position,
        kind: 'note',
        data: {},
        note: 'x',
        observed_at: observedAt,
        payload_sha256: 'x',
        deleted_at: deleted ? db.fn.now() : null,
      });
    };
    await insert(team.org.id, otherBlock.id, '2024-06-01T00:00:00Z');
    await insert(team.org.id, block.id, '2023-12-31T23:59:59Z');
    await insert(team.org.id, block.id, '2024-06-02T00:00:00Z', true);
    await insert(stranger.org.id, strangerBlock.id, '2024-06-01T00:00:00Z');
    const lines = (q: string) => download(q).then(({ text }) => Papa.parse(text.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true }).data.length);
    expect(await lines(`season=2024&blockId=${block.id}`)).toBe(4);
    expect(await lines('season=2024')).toBe(5);
    expect(await lines('season=2023')).toBe(1);
    expect((await manager.fetch(`/api/reports/observations.csv?season=2024&blockId=${strangerBlock.id}`)).status).toBe(404);
    expect((await manager.fetch('/api/reports/observations.csv')).status).toBe(422);
    expect((await new Client().fetch('/api/reports/observations.csv?season=2024')).status).toBe(401);
  });

  it('streams 200,000 rows with the server’s memory staying bounded', async () => {
    const pid = process.env.APP_PID;
    expect(pid, 'APP_PID: run through `npm test`, which starts the app and names its process').toBeTruthy();
    const db = testDb();
    const big = await makeBlock(team.org.id, { rows: 20, vinesPerRow: 50 });
    const note = `Bulk record for the export test, long enough to make the file large; ${'x'.repeat(300)}`;
    await db.raw(
      `with slots as (select id, row_number, position, row_number() over (order by row_number, position) - 1 as n from vine_positions where block_id = ?)
       insert into observations (id, organisation_id, block_id, position_id, row_number, position, kind, data, note, observed_at, severity, status, payload_sha256)
       select gen_random_uuid(), ?, ?, s.id, s.row_number, s.position, 'weak-budbreak',
              jsonb_build_object('budsRetained', 28, 'budsPushed', g % 29), ? || g, timestamptz '2022-01-01' + g * interval '97 seconds', 0, 'open', 'bulk'
         from generate_series(1, 200000) g join slots s on s.n = g % 1000`,
      [big.id, team.org.id, big.id, note],
    );
    const rss = () => Number(/VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))![1]) * 1024;
    const before = rss();
    let peak = before;
    const sampler = setInterval(() => (peak = Math.max(peak, rss())), 25);

    const res = await manager.fetch(`/api/reports/observations.csv?season=2022&blockId=${big.id}`);
    expect(res.status).toBe(200);
    const reader = res.body!.getReader();
    let bytes = 0;
    let lines = 0;
    let chunks = 0;
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      bytes += value.length;
      chunks++;
      for (const b of value) if (b === 10) lines++;
    }
    clearInterval(sampler);
    peak = Math.max(peak, rss());
    // One header and 200,000 records, one line each (the bulk notes have no line breaks).
    expect(lines).toBe(200_001);
    expect(bytes).toBeGreaterThan(100 * 1024 * 1024);
    // It arrived in pieces, not as one body built first.
    expect(chunks).toBeGreaterThan(50);
    // Holding the file (a JavaScript string of it is twice its bytes) or the 200,000 rows behind it
    // would take well over 100 MB; streaming page by page, the server grows by garbage awaiting
    // collection only (about 35 MB when this was written).
    expect(peak - before, `server memory grew by ${((peak - before) / 1048576).toFixed(0)} MB for a ${(bytes / 1048576).toFixed(0)} MB export`).toBeLessThan(
      64 * 1024 * 1024,
    );
  }, 180_000);
});
