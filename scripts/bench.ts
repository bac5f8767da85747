/**
 * `npm run bench`: speed and size figures, printed with their targets and ratios (never asserted
 * in tests). Starts the same throwaway services as `npm test` (slot from VINEWARD_SLOT), builds and
 * starts the app, then runs every tests/bench/*.bench.ts in turn; each exports
 * `default async function (ctx: BenchContext)` and prints its own lines through ctx.report.
 *
 *   npm run bench -- grid     runs only benches whose file name contains "grid"
 *   npm run bench -- scale --scale=full
 *                             the estate-wide benches (scale, load) at full size: about 200,000 vines,
 *                             1,000,000 observations, 100,000 photos; a small estate without it
 */
import { readdirSync } from 'node:fs';
import path from 'node:path';
import knex from 'knex';
import { seedDemo } from '../db/seeds/demo';
import type { BenchContext } from '../tests/bench/context';
import { buildIfNeeded, startNext } from './lib/app';
import { migrate } from './lib/migrate';
import { PROFILES } from './lib/profile';
import { ensureChromium, log, root, stopChild } from './lib/services';
import { startStack } from './lib/stack';

async function main() {
  const filter = process.argv.slice(2).find((a) => !a.startsWith('-'));
  const files = readdirSync(path.join(root, 'tests/bench'))
    .filter((f) => f.endsWith('.bench.ts') && (!filter || f.includes(filter)))
    .sort();
  // Lighthouse drives Debian's Chromium, installed here as `npm test` installs it for the browser tests.
  if (files.some((f) => f.includes('lighthouse'))) ensureChromium();
  const profile = PROFILES.test;
  const stack = await startStack(profile, { fast: true });
  let next: Awaited<ReturnType<typeof startNext>> | undefined;
  try {
    const env: NodeJS.ProcessEnv = { ...stack.env, BCRYPT_COST: '4', APP_URL: `http://localhost:${profile.appPort}` };
    Object.assign(process.env, env);
    await migrate(env.DATABASE_URL!);
    const db = knex({ client: 'pg', connection: env.DATABASE_URL, pool: { min: 0, max: 8 } });
    await seedDemo(db, { env });
    buildIfNeeded(env);
    next = await startNext(profile.appPort, env);
    // The fault bench stalls the S3 fake and watches the server's memory.
    env.APP_PID = String(next.pid);
    if (stack.s3?.pid) env.S3_PID = String(stack.s3.pid);
    Object.assign(process.env, env);
    const lines: string[] = [];
    const ctx: BenchContext = {
      db,
      appUrl: env.APP_URL!,
      env,
      distDir: path.join(root, env.NEXT_DIST_DIR ?? '.next'),
      scale: process.argv.includes('--scale=full') ? 'full' : 'small',
      report(line: string) {
        lines.push(line);
        console.log(`  ${line}`);
      },
    };
    for (const file of files) {
      log(`Bench ${file}`);
      const mod = (await import(path.join(root, 'tests/bench', file))) as { default: (ctx: BenchContext) => Promise<void> };
      await mod.default(ctx);
    }
    await db.destroy();
    console.log(`\nSummary\n${lines.map((l) => `  ${l}`).join('\n')}`);
  } finally {
    if (next) await stopChild(next);
    await stack.stop();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
