import { Client } from '../helpers/http';
import { median, percentile, type BenchContext } from './context';

// Creek Flat, the demo's 150 × 150 block; the bulk records go into a season of their own.
const CREEK_FLAT = '0b10c4a0-0000-4000-8000-000000000002';
const ROWS = 200_000;
const BULK_SEASON = 2021;
const REPORT_RUNS = 10;

async function fill(ctx: BenchContext) {
  await ctx.db('observations').where('payload_sha256', 'like', 'bench-export-%').delete();
  const started = Date.now();
  await ctx.db.raw(
    `insert into observations (id, organisation_id, block_id, position_id, row_number, position, kind, data, note, observed_at, severity, status, payload_sha256)
     select gen_random_uuid(), b.organisation_id, b.id, vp.id, vp.row_number, vp.position, 'weak-budbreak',
            jsonb_build_object('budsRetained', 28, 'budsPushed', g % 29), 'Bench record, with a comma and "quotes"',
            timestamptz '${BULK_SEASON}-01-02Z' + g * interval '150 seconds', 0, 'open', 'bench-export-' || g
       from generate_series(1, ?) g
       join blocks b on b.id = ?
       join vine_positions vp on vp.block_id = b.id and vp.row_number = 1 + (g % 22500) / 150 and vp.position = 1 + g % 150`,
    [ROWS, CREEK_FLAT],
  );
  await ctx.db.raw('vacuum analyze observations');
  ctx.report(`export: ${ROWS.toLocaleString('en-US')} records of ${BULK_SEASON} on Creek Flat, made in ${((Date.now() - started) / 1000).toFixed(1)} s`);
}

async function timeExport(ctx: BenchContext, client: Client) {
  const started = performance.now();
  const res = await client.fetch(`/api/reports/observations.csv?season=${BULK_SEASON}&blockId=${CREEK_FLAT}`);
  const reader = res.body!.getReader();
  let firstByteMs = 0;
  let bytes = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    if (!firstByteMs) firstByteMs = performance.now() - started;
    bytes += value.length;
  }
  const seconds = (performance.now() - started) / 1000;
  ctx.report(
    `export: ${ROWS.toLocaleString('en-US')} rows (${(bytes / 1048576).toFixed(0)} MB) in ${seconds.toFixed(1)} s, ` +
      `${Math.round(ROWS / seconds).toLocaleString('en-US')} rows/s (target > 20,000), first byte ${firstByteMs.toFixed(0)} ms (target < 500 ms)`,
  );
}

async function timeReports(ctx: BenchContext, client: Client) {
  // Statistics as autovacuum keeps them on a running server; a just-seeded database has none yet.
  await ctx.db.raw('analyze');
  for (const [name, path] of [
    ['block report (Creek Flat 2026, with 2025 beside it)', `/api/reports/blocks/${CREEK_FLAT}?season=2026`],
    ['estate report (4 blocks, 2026)', '/api/reports?season=2026'],
  ] as const) {
    const times: number[] = [];
    // One untimed request first: the server's first query plans and connections are not the figure.
    await (await client.fetch(path)).arrayBuffer();
    for (let i = 0; i < REPORT_RUNS; i++) {
      const started = performance.now();
      const res = await client.fetch(path);
      await res.arrayBuffer();
      times.push(performance.now() - started);
    }
    times.sort((a, b) => a - b);
    ctx.report(`${name}: median ${median(times).toFixed(0)} ms, p95 ${percentile(times, 95).toFixed(0)} ms (target p95 < 1,500 ms)`);
  }
}

export default async function bench(ctx: BenchContext) {
  const manager = new Client();
  await manager.signIn('manager@example.com', 'vineward-demo');
  await timeReports(ctx, manager);
  await fill(ctx);
  try {
    await timeExport(ctx, manager);
  } finally {
    await ctx.db('observations').where('payload_sha256', 'like', 'bench-export-%').delete();
  }
}
