/**
 * A whole estate's season (tests/bench/estate.ts): every figure beside the same work done in this
 * process without the server (its SQL, or the service it calls when the route assembles several
 * statements), taken in turn so that both see the same machine load. Small by default; the size
 * DESIGN.md promises with `npm run bench -- scale --scale=full`. Ends with the load run
 * (tests/bench/load.ts: 50 devices and 10 managers against 1 and 2 servers); `--no-load` skips it.
 */
import { loadavg } from 'node:os';
import { readFileSync } from 'node:fs';
import { Client } from '../helpers/http';
import { median, percentile, type BenchContext } from './context';
import { dropEstate, makeEstate, SEASON, serverModules, SIZES, type Estate } from './estate';
import { keptAlive } from './keep-alive';
import { underLoad } from './load';
import { measureIngest } from './sync.bench';

const load = () => loadavg()[0]!.toFixed(2);
const sorted = (xs: number[]) => [...xs].sort((a, b) => a - b);
const ms = (x: number) => `${x.toFixed(0)} ms`;

/** Times the route and its bare counterpart in turn; the first `warm` of each are not counted. */
async function pair(
  runs: number,
  route: (i: number) => Promise<unknown>,
  bare: (i: number) => Promise<unknown>,
  warm = 2,
  /** Run untimed before each of the two. */
  prepare?: () => Promise<unknown>,
) {
  const r: number[] = [];
  const b: number[] = [];
  for (let i = 0; i < runs + warm; i++) {
    await prepare?.();
    let t = performance.now();
    await route(i);
    const routeMs = performance.now() - t;
    await prepare?.();
    t = performance.now();
    await bare(i);
    const bareMs = performance.now() - t;
    if (i < warm) continue;
    r.push(routeMs);
    b.push(bareMs);
  }
  return { route: sorted(r), bare: sorted(b) };
}

function line(label: string, t: { route: number[]; bare: number[] }, target: string, bareName = 'bare SQL') {
  const [r, b] = [t.route, t.bare];
  return (
    `${label}: median ${ms(median(r))}, p95 ${ms(percentile(r, 95))} (${target}) over ${r.length}; ${bareName} median ${ms(median(b))}, p95 ${ms(percentile(b, 95))}; ` +
    `route/bare ${(median(r) / median(b)).toFixed(2)} by median, ${(percentile(r, 95) / percentile(b, 95)).toFixed(2)} by p95; load average ${load()}`
  );
}

async function ok(res: Response) {
  if (res.status !== 200) throw new Error(`${res.url} answered ${res.status}: ${(await res.text()).slice(0, 200)}`);
  return res.arrayBuffer();
}

async function grids(ctx: BenchContext, estate: Estate, manager: Client) {
  const { gridStatements, runGridStatements } = await import('@/lib/server/queries/grid');
  const { readGridFilters } = await import('@/lib/grid/filters');
  const filters = readGridFilters(new URLSearchParams(''));
  const runs = ctx.scale === 'full' ? 15 : 10;
  const all = { route: [] as number[], bare: [] as number[] };
  const fetched = { route: [] as number[], bare: [] as number[] };
  const perBlock: string[] = [];
  const browser = keptAlive(ctx.appUrl, manager.cookieHeader);
  for (const [i, id] of estate.blockIds.entries()) {
    const statements = gridStatements(estate.manager.organisationId, id, filters);
    const bare = () => runGridStatements(ctx.db, statements);
    const t = await pair(
      runs,
      async () => {
        const res = await browser.get(`/api/grid/${id}`);
        if (res.status !== 200) throw new Error(`grid route answered ${res.status}: ${res.text.slice(0, 200)}`);
      },
      bare,
    );
    all.route.push(...t.route);
    all.bare.push(...t.bare);
    perBlock.push(`block ${i + 1} p95 ${ms(percentile(t.route, 95))} (${(median(t.route) / median(t.bare)).toFixed(2)}×)`);
    const f = await pair(3, async () => ok(await manager.fetch(`/api/grid/${id}`)), bare, 1);
    fetched.route.push(...f.route);
    fetched.bare.push(...f.bare);
  }
  browser.close();
  ctx.report(
    line(
      `scale grid route, all open findings, ${estate.blockIds.length} blocks of ${estate.size.side} × ${estate.size.side}, over one kept-alive connection with gzip`,
      { route: sorted(all.route), bare: sorted(all.bare) },
      'target p95 ≤ 60 ms, route/SQL ≤ 1.3',
    ),
  );
  ctx.report(`scale grid route per block: ${perBlock.join('; ')}`);
  ctx.report(
    line("scale grid route through undici's fetch (its own cost included)", { route: sorted(fetched.route), bare: sorted(fetched.bare) }, 'no target'),
  );
}

async function reports(ctx: BenchContext, estate: Estate, manager: Client) {
  const { loadBlockReport, loadEstateReport } = await import('@/lib/server/services/reports');
  const { parseReportOptions } = await import('@/lib/validation/report');
  const options = parseReportOptions(new URLSearchParams(`season=${SEASON}`));
  const block = estate.blockIds[0]!;
  const runs = ctx.scale === 'full' ? 8 : 6;
  // Nothing kept: every block worked out from its records, as after a change in each.
  const forget = () => ctx.db('report_snapshots').whereIn('block_id', estate.blockIds).delete();
  // One new record in one block (a different one each time), as while a scout syncs.
  let turn = 0;
  const oneChange = () =>
    ctx.db.raw(
      `insert into observations (id, organisation_id, block_id, position_id, row_number, position, kind, data, note, observed_at, severity, status, payload_sha256)
       select gen_random_uuid(), ?, vp.block_id, vp.id, vp.row_number, vp.position, 'note', '{}', 'bench', timestamptz '${SEASON}-06-01Z', 0, 'open', 'bench-change'
         from vine_positions vp where vp.block_id = ? and vp.status = 'planted' limit 1`,
      [estate.manager.organisationId, estate.blockIds[turn++ % estate.blockIds.length]!],
    );
  const blockRoute = async () => ok(await manager.fetch(`/api/reports/blocks/${block}?season=${SEASON}`));
  const blockBare = () => loadBlockReport(estate.manager, block, options);
  const estateRoute = async () => ok(await manager.fetch(`/api/reports?season=${SEASON}`));
  const estateBare = () => loadEstateReport(estate.manager, options);
  const blockTitle = `scale block report (${estate.size.side} × ${estate.size.side}, ${SEASON} with ${SEASON - 1} beside it)`;
  const estateTitle = `scale estate report (${estate.blockIds.length} blocks, ${SEASON})`;
  ctx.report(
    line(`${blockTitle}, worked out from the records`, await pair(runs, blockRoute, blockBare, 2, forget), 'target p95 ≤ 1,500 ms', 'the service in-process'),
  );
  ctx.report(line(`${blockTitle}, unchanged since last read`, await pair(runs * 2, blockRoute, blockBare), 'target p95 ≤ 1,500 ms', 'the service in-process'));
  ctx.report(
    line(
      `${estateTitle}, every block worked out from its records`,
      await pair(runs, estateRoute, estateBare, 1, forget),
      'no target: the worst case',
      'the service in-process',
    ),
  );
  ctx.report(
    line(
      `${estateTitle}, one block changed since last read`,
      await pair(runs, estateRoute, estateBare, 2, oneChange),
      'target p95 ≤ 1,500 ms',
      'the service in-process',
    ),
  );
  ctx.report(
    line(`${estateTitle}, unchanged since last read`, await pair(runs * 2, estateRoute, estateBare), 'target p95 ≤ 1,500 ms', 'the service in-process'),
  );
  await ctx.db('observations').where({ organisation_id: estate.manager.organisationId, payload_sha256: 'bench-change' }).delete();
}

function rss(pid: number) {
  return Number(readFileSync(`/proc/${pid}/status`, 'utf8').match(/VmRSS:\s+(\d+) kB/)![1]) * 1024;
}

async function exportCsv(ctx: BenchContext, estate: Estate, manager: Client) {
  const { exportObservations } = await import('@/lib/server/services/reports');
  const pid = Number(ctx.env.APP_PID);
  const before = rss(pid);
  let peak = before;
  const sampler = setInterval(() => (peak = Math.max(peak, rss(pid))), 100);
  const started = performance.now();
  const res = await manager.fetch(`/api/reports/observations.csv?season=${SEASON}`);
  let lines = 0;
  let bytes = 0;
  let firstByte = 0;
  for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
    if (!firstByte) firstByte = performance.now() - started;
    bytes += chunk.length;
    for (const c of chunk) if (c === 10) lines++;
  }
  const seconds = (performance.now() - started) / 1000;
  clearInterval(sampler);
  const rows = lines - 1;
  // The same export read in this process: its keyset pages and CSV lines, no HTTP.
  const bareStarted = performance.now();
  const { stream } = await exportObservations(estate.manager, SEASON);
  for await (const _ of stream as unknown as AsyncIterable<Uint8Array>) void _;
  const bareSeconds = (performance.now() - bareStarted) / 1000;
  ctx.report(
    `scale CSV export: ${rows.toLocaleString('en-US')} rows (${(bytes / 1048576).toFixed(0)} MB) in ${seconds.toFixed(1)} s, ` +
      `${Math.round(rows / seconds).toLocaleString('en-US')} rows/s (target ≥ 40,000), first byte ${ms(firstByte)}; in-process ${Math.round(rows / bareSeconds).toLocaleString('en-US')} rows/s, ` +
      `route/bare ${(seconds / bareSeconds).toFixed(2)}; server memory ${(before / 1048576).toFixed(0)} MB before, peak ${(peak / 1048576).toFixed(0)} MB (+${((peak - before) / 1048576).toFixed(0)} MB); load average ${load()}`,
  );
}

async function progress(ctx: BenchContext, estate: Estate, manager: Client) {
  const { blockProgressContract } = await import('@/lib/server/services/row-work');
  const block = estate.blockIds[0]!;
  ctx.report(
    line(
      `scale work progress (one block, 5 passes over ${estate.size.side} rows)`,
      await pair(
        ctx.scale === 'full' ? 20 : 10,
        async () => ok(await manager.fetch(`/api/blocks/${block}/progress?season=${SEASON}`)),
        () => blockProgressContract(estate.manager, block, SEASON),
      ),
      'no target of its own',
      'the service in-process',
    ),
  );
}

async function photoLog(ctx: BenchContext, estate: Estate, manager: Client) {
  const { listPhotoLog } = await import('@/lib/server/queries/photo-log');
  const { decodeCursor, parsePhotoFilters } = await import('@/lib/grid/photo-filters');
  const filters = parsePhotoFilters(new URLSearchParams(''));
  let cursor: string | null = null;
  const pages = ctx.scale === 'full' ? 40 : 20;
  const t = await pair(
    pages,
    async () => {
      const res = await manager.fetch(`/api/photos?limit=30${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ''}`);
      const body = JSON.parse(Buffer.from(await ok(res)).toString()) as { nextCursor: string | null };
      // The bare query reads the same page as the route just did.
      return (cursor = body.nextCursor ?? cursor);
    },
    () => listPhotoLog(ctx.db, estate.manager.organisationId, filters, cursor ? decodeCursor(cursor) : null, 30),
  );
  ctx.report(
    line(`scale photo log page (30 of ${estate.size.photos.toLocaleString('en-US')} photos, newest first, paged by cursor)`, t, 'target p95 ≤ 100 ms'),
  );
}

export default async function scaleBench(ctx: BenchContext) {
  serverModules();
  const size = SIZES[ctx.scale];
  const estate = await makeEstate(ctx.db, size, (l) => console.log(l));
  ctx.report(
    `scale estate (${ctx.scale}): ${estate.blockIds.length} blocks, ${estate.vines.toLocaleString('en-US')} planted vines, ${size.observations.toLocaleString('en-US')} observations, ` +
      `${size.photos.toLocaleString('en-US')} photo rows, a season of row work, made in ${estate.seconds.toFixed(0)} s; load average ${load()}`,
  );
  try {
    const manager = new Client();
    await manager.signIn(estate.managerEmail, 'vineward-demo');
    await grids(ctx, estate, manager);
    await reports(ctx, estate, manager);
    await progress(ctx, estate, manager);
    await photoLog(ctx, estate, manager);
    await exportCsv(ctx, estate, manager);
    await measureIngest(
      ctx,
      { blockId: estate.blockIds[1]!, rows: size.side, vinesPerRow: size.side, email: estate.scoutEmail },
      `, into the estate's ${size.observations.toLocaleString('en-US')}`,
    );
    if (!process.argv.includes('--no-load')) await underLoad(ctx, estate);
  } finally {
    if (!process.env.BENCH_KEEP_ESTATE) await dropEstate(ctx.db);
  }
}
