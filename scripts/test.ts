/**
 * `npm test`: type-check, lint, then every test against real services: a throwaway PostgreSQL,
 * the S3 fake and the SMTP fake on loopback, the built app on :3100, vitest (unit and
 * integration) and Playwright in Debian's Chromium. Never touches the demo's data.
 *
 *   --quick       skip type-check, lint and the format check
 *   --only=unit|integration|e2e   run one suite
 *   extra arguments after `--` go to the test runner(s) as filters
 */
import { spawnSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import knex from 'knex';
import { seedDemo } from '../db/seeds/demo';
import { buildIfNeeded, startNext } from './lib/app';
import { migrate } from './lib/migrate';
import { PROFILES } from './lib/profile';
import { ensureChromium, log, postgresBin, root, stopChild } from './lib/services';
import { startStack } from './lib/stack';

const args = process.argv.slice(2);
const quick = args.includes('--quick');
const only = args.find((a) => a.startsWith('--only='))?.split('=')[1];
const filters = args.includes('--') ? args.slice(args.indexOf('--') + 1) : [];

function step(name: string, cmd: string, cmdArgs: string[], env: NodeJS.ProcessEnv = process.env) {
  log(name);
  const started = Date.now();
  const result = spawnSync(cmd, cmdArgs, { cwd: root, stdio: 'inherit', env });
  log(`${name}: ${result.status === 0 ? 'passed' : 'FAILED'} in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  return result.status === 0;
}

async function main() {
  postgresBin();
  if (!only || only === 'e2e') ensureChromium();

  const failures: string[] = [];
  if (!quick) {
    if (!step('Type-check', process.execPath, ['node_modules/typescript/bin/tsc', '--noEmit'])) failures.push('type-check');
    if (!step('Lint', process.execPath, ['node_modules/eslint/bin/eslint.js', '--max-warnings=0', '.'])) failures.push('lint');
    if (!step('Format (Prettier)', process.execPath, ['node_modules/prettier/bin/prettier.cjs', '--check', '--log-level=warn', '.'])) failures.push('format');
  }

  const profile = PROFILES.test;
  rmSync(profile.dir, { recursive: true, force: true });
  const stack = await startStack(profile, { fast: true });
  let next: Awaited<ReturnType<typeof startNext>> | undefined;
  try {
    const env: NodeJS.ProcessEnv = {
      ...stack.env,
      // Cheap enough for fast tests, dear enough (about 140 ms) that a sign-in that skips bcrypt shows in timing.
      BCRYPT_COST: '10',
      // vitest.config.ts keeps the name the project asks for; Vite's note about .mts is noise here.
      VITE_CONFIG_NATIVE_IGNORE_WARNING: 'true',
      APP_URL: `http://localhost:${profile.appPort}`,
      ADMIN_DATABASE_URL: stack.adminDatabaseUrl,
      // Fault tests stall, stop and restart these (tests/helpers/faults.ts); unset when a real service is used.
      S3_PID: stack.s3?.pid ? String(stack.s3.pid) : undefined,
      SMTP_PID: stack.smtp?.pid ? String(stack.smtp.pid) : undefined,
      PG_DATA: stack.pgData,
      PG_BIN: stack.pgData ? postgresBin() : undefined,
      // A port of this slot's range that nothing else uses: the fault suite's own second app server.
      SPARE_APP_PORT: String(profile.appPort + 5),
    };
    await migrate(env.DATABASE_URL!);
    const db = knex({ client: 'pg', connection: env.DATABASE_URL });
    // The browser tests sign the demo accounts in many times: their hashes stay cheap.
    await seedDemo(db, { env: { ...env, BCRYPT_COST: '4' } }).finally(() => db.destroy());

    const needsApp = only !== 'unit';
    if (needsApp) {
      buildIfNeeded(env);
      next = await startNext(profile.appPort, env);
      // Lets tests watch the server process itself (e.g. its memory during a large export).
      env.APP_PID = String(next.pid);
    }
    const vitest = [process.execPath, 'node_modules/vitest/vitest.mjs', 'run'];
    if (!only || only === 'unit') {
      if (!step('Unit tests (vitest)', vitest[0]!, [...vitest.slice(1), '--project', 'unit', '--coverage.enabled', ...filters], env)) failures.push('unit');
    }
    if (!only || only === 'integration') {
      if (!step('Integration tests (vitest, real services)', vitest[0]!, [...vitest.slice(1), '--project', 'integration', ...filters], env))
        failures.push('integration');
    }
    if (!only || only === 'e2e') {
      if (!step('Browser tests (Playwright, Chromium)', process.execPath, ['node_modules/@playwright/test/cli.js', 'test', ...filters], env))
        failures.push('e2e');
    }
  } finally {
    if (next) await stopChild(next);
    await stack.stop();
  }
  if (failures.length) {
    console.error(`\nFailed: ${failures.join(', ')}`);
    process.exit(1);
  }
  log('All checks passed');
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
