import { createRequire } from 'node:module';
import { seasonBounds, seasonOf } from '@/lib/reports/season';
import { Client } from '../helpers/http';
import { median, percentile, type BenchContext } from './context';

// Creek Flat, the demo's 150 × 150 block, carries the season's records.
const CREEK_FLAT = '0b10c4a0-0000-4000-8000-000000000002';
const OBSERVATIONS = 400_000;
const RUNS = 30;
const KINDS = ['cane-diameter', 'shade-cane', 'weak-budbreak', 'trunk-injury', 'cane-injury', 'missing-vine', 'bud-injury', 'pruning-record', 'note'];

/** The Desk's own queries; 'server-only' refuses to load outside Next's server build, so it is stubbed here. */
async function deskQueries() {
  const require = createRequire(__filename);
  const marker = require.resolve('server-only');
  require.cache[marker] = { id: marker, filename: marker, loaded: true, exports: {} } as NodeJS.Module;
  return {
    desk: await import('@/lib/server/queries/desk'),
    tasks: await import('@/lib/server/queries/tasks'),
    sprays: await import('@/lib/server/queries/sprays'),
  };
}

/** Each query's bare SQL time, to show where the route's time goes. */
async function timeQueries(ctx: BenchContext, org: string) {
  const q = await deskQueries();
  const o = await ctx.db('organisations').where({ id: org }).first('season_start_month');
  const period = seasonBounds(seasonOf(new Date(), o.season_start_month), o.season_start_month);
  const dayAgo = new Date(Date.now() - 86_400_000);
  const parts: [string, () => Promise<unknown>][] = [
    ['new findings (a day)', () => q.desk.listFreshFindings(ctx.db, org, dayAgo)],
    ['coverage', () => q.desk.listScoutingCoverage(ctx.db, org, period)],
    ['flags not in a task', () => q.desk.listUntaskedFlagBlocks(ctx.db, org)],
    ['overdue tasks', () => q.tasks.listTasks(ctx.db, org, { status: 'open', overdue: true }, 200)],
    ['sprays in force', () => q.sprays.listSpraysInForce(ctx.db, org)],
  ];
  for (const [label, run] of parts) {
    const times: number[] = [];
    for (let i = 0; i < 13; i++) {
      const t = performance.now();
      await run();
      if (i >= 3) times.push(performance.now() - t);
    }
    ctx.report(`desk SQL, ${label}: median ${median([...times].sort((a, b) => a - b)).toFixed(0)} ms`);
  }
}

/** A season's records so far, received as they were made, spread evenly up to now. */
export async function fill(ctx: BenchContext) {
  const { db } = ctx;
  await db('observations').where('payload_sha256', 'like', 'bench-%').delete();
  const org = await db('blocks as b').join('organisations as o', 'o.id', 'b.organisation_id').where('b.id', CREEK_FLAT).first('o.id', 'o.season_start_month');
  const now = new Date();
  const from = Math.max(Date.parse(seasonBounds(seasonOf(now, org.season_start_month), org.season_start_month).from), now.getTime() - 150 * 86_400_000);
  const spanMinutes = Math.floor((now.getTime() - from) / 60_000);
  const started = Date.now();
  await db.raw(
    `insert into observations (id, organisation_id, block_id, position_id, row_number, position, kind, data, note,
       observed_at, received_at, severity, status, payload_sha256)
     select gen_random_uuid(), b.organisation_id, b.id, vp.id, vp.row_number, vp.position, (?::text[])[1 + (g % 9)], '{}'::jsonb, '',
       t.at, t.at + interval '5 minutes',
       case when h < 55 then 0 when h < 80 then 1 when h < 95 then 2 else 3 end,
       case when g % 7 = 0 then 'closed' else 'open' end, 'bench-desk-' || g
     from generate_series(1, ?) g
     cross join lateral (select abs(hashint4(g)) % 100 as h, abs(hashint4(g * 31)) % 22500 as slot) x
     cross join lateral (select to_timestamp(?::bigint / 1000) + ((g::bigint * ?) / ?) * interval '1 minute' - interval '10 minutes' as at) t
     join blocks b on b.id = ?
     join vine_positions vp on vp.block_id = b.id and vp.row_number = 1 + x.slot / 150 and vp.position = 1 + x.slot % 150`,
    [KINDS, OBSERVATIONS, from, spanMinutes, OBSERVATIONS, CREEK_FLAT],
  );
  await db.raw('vacuum analyze observations');
  ctx.report(`desk: ${OBSERVATIONS.toLocaleString('en-US')} observations this season on Creek Flat, made in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  return org.id as string;
}

async function time(ctx: BenchContext, label: string, client: Client, before?: () => Promise<void>) {
  const runs: number[] = [];
  for (let i = 0; i < RUNS + 3; i++) {
    await before?.();
    const t = performance.now();
    const res = await client.fetch('/api/desk');
    await res.arrayBuffer();
    if (res.status !== 200) throw new Error(`desk answered ${res.status}`);
    if (i >= 3) runs.push(performance.now() - t);
  }
  const sorted = [...runs].sort((a, b) => a - b);
  ctx.report(
    `desk route, ${label}: median ${median(sorted).toFixed(0)} ms, p95 ${percentile(sorted, 95).toFixed(0)} ms over ${RUNS} requests (no target set yet)`,
  );
}

/** The Desk over a season of 400,000 records: a manager whose last look was a day ago, and the advisor of two estates. */
export default async function deskBench(ctx: BenchContext) {
  const org = await fill(ctx);
  try {
    await timeQueries(ctx, org);
    const manager = new Client();
    await manager.signIn('manager@example.com', 'vineward-demo');
    const managerId = (await ctx.db('users').where({ email: 'manager@example.com' }).first('id')).id as string;
    // Each request is a look; the window is held at a day so every run reads the same findings.
    const dayAgo = async () => {
      await ctx
        .db('desk_looks')
        .where({ user_id: managerId, organisation_id: org })
        .update({ since: ctx.db.raw(`now() - interval '1 day'`), looked_at: ctx.db.fn.now() });
    };
    await manager.fetch('/api/desk');
    await time(ctx, 'manager, last look a day ago', manager, dayAgo);
    const advisor = new Client();
    await advisor.signIn('advisor@example.com', 'vineward-demo');
    await time(ctx, 'advisor of two estates', advisor);
  } finally {
    await ctx.db('observations').where('payload_sha256', 'like', 'bench-desk-%').delete();
  }
}
