import { createRequire } from 'node:module';
import { loadavg } from 'node:os';
import bcrypt from 'bcryptjs';
import { seasonBounds, seasonOf } from '@/lib/reports/season';
import { buildBlockProgress } from '@/lib/work/progress';
import { Client } from '../helpers/http';
import { median, percentile, type BenchContext } from './context';

// A bench estate of nine 150 × 150 blocks, each with a season of row work in every pass.
const ORG = '5d1f0a3e-7c2b-4e8a-9b61-0a0d2c9e4fb1';
const MANAGER = { id: '8a6b2c10-1d4e-4f3a-8b7c-0000000000b1', email: 'bench-work-manager@example.com', password: 'bench-work-password' };
const BLOCKS = Array.from({ length: 9 }, (_, i) => `0b10c4a0-0000-4000-8000-0000000000b${i + 1}`);
const PASSES = ['pre-pruning', 'pruning', 'brush-removal', 'tying', 'shoot-thinning'];
const RUNS = 40;

/** The route's own statements; 'server-only' refuses to load outside Next's server build, so it is stubbed here. */
async function rowWorkQueries() {
  const require = createRequire(__filename);
  const marker = require.resolve('server-only');
  require.cache[marker] = { id: marker, filename: marker, loaded: true, exports: {} } as NodeJS.Module;
  return import('@/lib/server/queries/row-work');
}

export async function fillEstate(ctx: BenchContext) {
  const { db } = ctx;
  const started = Date.now();
  await db('organisations').insert({ id: ORG, name: 'Bench work estate', pay_basis: 'hourly', hourly_rate: 30 }).onConflict('id').ignore();
  await db('users')
    .insert({ id: MANAGER.id, email: MANAGER.email, name: 'Bench manager', password_hash: await bcrypt.hash(MANAGER.password, 4) })
    .onConflict('id')
    .ignore();
  await db('memberships').insert({ organisation_id: ORG, user_id: MANAGER.id, role: 'manager' }).onConflict(['organisation_id', 'user_id']).ignore();
  for (const [i, id] of BLOCKS.entries()) {
    if (await db('blocks').where({ id }).first('id')) continue;
    await db('blocks').insert({
      id,
      organisation_id: ORG,
      name: `Bench block ${i + 1}`,
      variety: 'Bench Noir',
      training_system: i % 2 ? 'spur' : 'cane',
      row_spacing_m: 2.5,
      vine_spacing_m: 1.2,
      row_count: 150,
      vines_per_row: 150,
    });
    await db.raw(`insert into block_rows (block_id, row_number, vine_count) select ?, r, 150 from generate_series(1, 150) r`, [id]);
    // One slot in forty empty, as in an older block.
    await db.raw(
      `insert into vine_positions (block_id, row_number, position, status)
       select ?, r, p, case when abs(hashint4(r * 1000 + p)) % 40 = 0 then 'missing' else 'planted' end
         from generate_series(1, 150) r, generate_series(1, 150) p`,
      [id],
    );
  }
  await db('row_work').where({ organisation_id: ORG }).delete();
  // Per block, pass and row: three overlapping runs and one whole-row repeat; every tenth row stops short at vine 140.
  await db.raw(
    `insert into row_work (id, organisation_id, block_id, row_number, pass, from_position, to_position, crew_size, person_hours,
       started_at, finished_at, note, recorded_by, payload_sha256)
     select gen_random_uuid(), ?, b, r, pass, run.f, case when run.t = 150 and r % 10 = 0 then 140 else run.t end, 4, 1 + (r % 5) * 0.5,
            null, greatest(date_trunc('year', now()), now() - (r % 60) * interval '1 day' - interval '1 hour'), '', ?, 'bench-row-work'
       from unnest(?::uuid[]) b, unnest(?::text[]) pass, generate_series(1, 150) r,
            (values (1, 60), (50, 110), (100, 150), (null, null)) as run(f, t)
      where run.f is not null or r % 10 <> 0`,
    [ORG, MANAGER.id, BLOCKS, PASSES],
  );
  await db.raw('vacuum analyze row_work, vine_positions, block_rows');
  const n = (await db('row_work').where({ organisation_id: ORG }).count({ n: '*' }).first())!.n;
  ctx.report(
    `row work: ${Number(n).toLocaleString('en-US')} records over 9 blocks of 150 × 150 in every pass, made in ${((Date.now() - started) / 1000).toFixed(1)} s`,
  );
}

const ms = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return `median ${median(s).toFixed(0)} ms, p95 ${percentile(s, 95).toFixed(0)} ms`;
};

/** Progress route for one 150 × 150 block, the estate progress of nine, and the estate page that shows it. */
export default async function rowWorkBench(ctx: BenchContext) {
  await fillEstate(ctx);
  const season = seasonOf(new Date());
  const q = await rowWorkQueries();
  const manager = new Client();
  await manager.signIn(MANAGER.email, MANAGER.password);

  const route: number[] = [];
  for (let i = 0; i < RUNS + 5; i++) {
    const t = performance.now();
    const res = await manager.fetch(`/api/blocks/${BLOCKS[0]}/progress?season=${season}`);
    await res.arrayBuffer();
    if (res.status !== 200) throw new Error(`progress route answered ${res.status}`);
    if (i >= 5) route.push(performance.now() - t);
  }
  ctx.report(`progress route, one 150 × 150 block with 585 records in each of the 5 passes: ${ms(route)} (target p95 < 150 ms) over ${RUNS} requests`);

  const estate: number[] = [];
  const period = seasonBounds(season, 1);
  for (let i = 0; i < 15 + 3; i++) {
    const t = performance.now();
    const blocks = await q.listProgressBlocks(ctx.db, ORG);
    const ids = blocks.map((b) => b.id);
    const [coverage, days] = await Promise.all([q.countCoverage(ctx.db, ORG, ids, period), q.listWorkDays(ctx.db, ORG, ids, period)]);
    const pay = { basis: 'hourly', hourlyRate: 30, pieceRatePerVine: null } as const;
    blocks.map((block) =>
      buildBlockProgress({
        block,
        rows: coverage.rows.get(block.id) ?? [],
        leads: coverage.leads.get(block.id) ?? [],
        workDays: days.get(block.id) ?? {},
        pay,
      }),
    );
    if (i >= 3) estate.push(performance.now() - t);
  }
  ctx.report(`estate progress (loadEstateProgress's statements and assembly), 9 blocks of 150 × 150: ${ms(estate)} (target p95 < 500 ms) over 15 runs`);

  const page: number[] = [];
  for (let i = 0; i < 10 + 2; i++) {
    const t = performance.now();
    const res = await manager.fetch(`/work?season=${season}`);
    await res.arrayBuffer();
    if (res.status !== 200) throw new Error(`work page answered ${res.status}`);
    if (i >= 2) page.push(performance.now() - t);
  }
  ctx.report(
    `estate work page (server render), 9 blocks of 150 × 150: ${ms(page)} (target p95 < 800 ms) over 10 requests; load average ${loadavg()[0]!.toFixed(1)} while measuring`,
  );
}
