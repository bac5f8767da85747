import { createRequire } from 'node:module';
import { gzipSync } from 'node:zlib';
import { chromium, type Browser } from '@playwright/test';
import playwrightConfig from '../../playwright.config';
import { readGridFilters } from '@/lib/grid/filters';
import { Client } from '../helpers/http';
import { median, percentile, type BenchContext } from './context';

// Creek Flat, the demo's 150 × 150 block.
const CREEK_FLAT = '0b10c4a0-0000-4000-8000-000000000002';
const OBSERVATIONS = 200_000;
const RUNS = 60;
const KINDS = ['cane-diameter', 'shade-cane', 'weak-budbreak', 'trunk-injury', 'cane-injury', 'missing-vine', 'bud-injury', 'pruning-record', 'note'];
// The morning view and a kind filter (both from the standing summary), and date ranges (which
// need the observations themselves).
const VIEWS = [
  ['all open findings', ''],
  ['2 kinds', 'kind=trunk-injury,weak-budbreak'],
  ['2 kinds, 3 months', 'kind=trunk-injury,weak-budbreak&from=2026-02-01&to=2026-04-30'],
  ['one week', 'from=2026-03-01&to=2026-03-07'],
] as const;

/** The route's own statements and runner; 'server-only' refuses to load outside Next's server build, so it is stubbed here. */
async function gridQueries() {
  const require = createRequire(__filename);
  const marker = require.resolve('server-only');
  require.cache[marker] = { id: marker, filename: marker, loaded: true, exports: {} } as NodeJS.Module;
  return import('@/lib/server/queries/grid');
}

/** A season's worth of records on one block, made in the database in one statement. */
async function fillBlock(ctx: BenchContext) {
  const { db } = ctx;
  await db('observations').where('payload_sha256', 'like', 'bench-%').delete();
  const scout = (await db('users').where({ email: 'scout@example.com' }).first('id')).id as string;
  const started = Date.now();
  // Severity roughly as a season runs: most records fine, one in twenty urgent; one in seven closed.
  await db.raw(
    `insert into observations (id, organisation_id, block_id, position_id, row_number, position, kind, data, note,
       observed_at, recorded_by, severity, status, closed_at, payload_sha256)
     select gen_random_uuid(), b.organisation_id, b.id, vp.id, vp.row_number, vp.position,
       (?::text[])[1 + (g % 9)], '{}'::jsonb, '',
       timestamptz '2026-01-05 07:00Z' + ((g * 37) % 150) * interval '1 day' + (g % 540) * interval '1 minute', ?,
       case when h < 55 then 0 when h < 80 then 1 when h < 95 then 2 else 3 end,
       case when g % 7 = 0 then 'closed' else 'open' end, case when g % 7 = 0 then timestamptz '2026-06-01Z' end,
       'bench-' || g
     from generate_series(1, ?) g
     cross join lateral (select abs(hashint4(g)) % 100 as h, abs(hashint4(g * 31)) % 22500 as slot) x
     join blocks b on b.id = ?
     join vine_positions vp on vp.block_id = b.id and vp.row_number = 1 + x.slot / 150 and vp.position = 1 + x.slot % 150`,
    [KINDS, scout, OBSERVATIONS, CREEK_FLAT],
  );
  // As autovacuum would by the morning: statistics, and pages marked all-visible for index-only reads
  // (a second pass catches pages an open snapshot held back the first time).
  await db.raw('vacuum analyze observations, grid_vines, grid_counts');
  await new Promise((resolve) => setTimeout(resolve, 2000));
  await db.raw('vacuum observations, grid_vines');
  const visible = (await db.raw(`select round(100.0 * relallvisible / greatest(relpages, 1)) as percent from pg_class where relname = 'observations'`)).rows[0]
    .percent;
  const total = (await db('observations').where({ block_id: CREEK_FLAT }).whereNull('deleted_at').count({ n: '*' }).first())!.n;
  ctx.report(
    `grid: ${Number(total).toLocaleString('en-US')} live observations on Creek Flat (150 × 150), made in ${((Date.now() - started) / 1000).toFixed(1)} s, ${visible}% of pages all-visible`,
  );
}

async function timeRoute(ctx: BenchContext) {
  const { gridSource, gridStatements, runGridStatements } = await gridQueries();
  const org = (await ctx.db('blocks').where({ id: CREEK_FLAT }).first('organisation_id')).organisation_id as string;
  const manager = new Client();
  await manager.signIn('manager@example.com', 'vineward-demo');
  for (const [label, view] of VIEWS) {
    const filters = readGridFilters(new URLSearchParams(view));
    const statements = gridStatements(org, CREEK_FLAT, filters);
    const route: number[] = [];
    const sql: number[] = [];
    const inRoute: number[] = [];
    let bytes = 0;
    for (let i = 0; i < RUNS + 5; i++) {
      let t = performance.now();
      const res = await manager.fetch(`/api/grid/${CREEK_FLAT}${view ? `?${view}` : ''}`);
      const body = await res.arrayBuffer();
      const routeMs = performance.now() - t;
      if (res.status !== 200) throw new Error(`grid route answered ${res.status}`);
      t = performance.now();
      await runGridStatements(ctx.db, statements);
      const sqlMs = performance.now() - t;
      // The first runs warm the caches and the JIT.
      if (i < 5) continue;
      route.push(routeMs);
      sql.push(sqlMs);
      inRoute.push(Number(/dur=([\d.]+)/.exec(res.headers.get('server-timing') ?? '')?.[1] ?? NaN));
      bytes = gzipSync(Buffer.from(body)).length;
    }
    const sorted = (xs: number[]) => [...xs].sort((a, b) => a - b);
    const [r, s] = [sorted(route), sorted(sql)];
    ctx.report(
      `grid route, ${label} (vines read from ${gridSource(filters) === 'summary' ? 'the summary' : 'the observations'}): median ${median(r).toFixed(0)} ms, p95 ${percentile(r, 95).toFixed(0)} ms (target p95 < 150 ms) over ${RUNS} requests; ` +
        `bare SQL median ${median(s).toFixed(0)} ms, p95 ${percentile(s, 95).toFixed(0)} ms; ratio route/SQL ${(median(r) / median(s)).toFixed(2)} (median); ` +
        `SQL inside the route median ${median(inRoute).toFixed(0)} ms; ${(bytes / 1024).toFixed(0)} KB of JSON gzipped`,
    );
  }
}

async function timeFirstRender(ctx: BenchContext, browser: Browser) {
  const sizes = [
    ['phone', { width: 360, height: 740 }, true],
    ['laptop', { width: 1366, height: 900 }, false],
  ] as const;
  for (const [name, viewport, mobile] of sizes) {
    // No service worker: it would reload the page once it takes control, mid-measurement.
    const context = await browser.newContext({ baseURL: ctx.appUrl, viewport, isMobile: mobile, hasTouch: mobile, serviceWorkers: 'block' });
    const page = await context.newPage();
    await page.goto('/signin');
    await page.getByLabel('E-mail').fill('manager@example.com');
    await page.getByLabel('Password').fill('vineward-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/desk/);
    const drawn: number[] = [];
    const painted: number[] = [];
    const fromStart: number[] = [];
    for (let i = 0; i < 8; i++) {
      await page.goto(`/grid/${CREEK_FLAT}`);
      await page.waitForFunction(() => performance.getEntriesByName('vw-grid-painted').length > 0, undefined, { timeout: 30_000 });
      const [data, draw, paint] = await page.evaluate(() =>
        ['vw-grid-data', 'vw-grid-drawn', 'vw-grid-painted'].map((n) => performance.getEntriesByName(n)[0]!.startTime),
      );
      if (i === 0) continue;
      drawn.push(draw! - data!);
      painted.push(paint! - data!);
      fromStart.push(paint!);
    }
    ctx.report(
      `grid first render in Chromium (${name} ${viewport.width} px): drawn ${median(drawn).toFixed(0)} ms, painted ${median(painted).toFixed(0)} ms after the data arrived ` +
        `(median of ${drawn.length}, worst ${Math.max(...painted).toFixed(0)} ms; target < 500 ms); page start to painted grid ${median(fromStart).toFixed(0)} ms`,
    );
    await context.close();
  }
}

/** Grid speed for the 150 × 150 demo block with 200,000 observations: the route against its bare SQL, and the first render. */
export default async function gridBench(ctx: BenchContext) {
  await fillBlock(ctx);
  const browser = await chromium.launch(playwrightConfig.use?.launchOptions);
  try {
    await timeRoute(ctx);
    await timeFirstRender(ctx, browser);
  } finally {
    await browser.close();
    // The benches after this one measure against the demo as seeded.
    await ctx.db('observations').where('payload_sha256', 'like', 'bench-%').delete();
  }
}
