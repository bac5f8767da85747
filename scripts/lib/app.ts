/** Builds the Next.js app when its sources changed, and runs `next start` as a child process. */
import { spawn, type ChildProcess } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { log, root, run, track, waitForPort } from './services';

const SOURCES = [
  'app',
  'components',
  'lib',
  'service-worker',
  'public',
  'types',
  'proxy.ts',
  'instrumentation.ts',
  'instrumentation-node.ts',
  'next.config.mjs',
  'tailwind.config.ts',
  'postcss.config.mjs',
  'package-lock.json',
  'tsconfig.json',
];

function walk(entry: string, out: string[]) {
  const full = path.join(root, entry);
  if (!existsSync(full)) return;
  const stat = statSync(full);
  if (stat.isDirectory()) {
    for (const name of readdirSync(full).sort()) walk(path.join(entry, name), out);
  } else if (!entry.endsWith('sw.js') && !entry.endsWith('sw.js.map')) {
    out.push(`${entry}:${stat.size}:${stat.mtimeMs}`);
  }
}

function fingerprint() {
  const files: string[] = [];
  for (const s of SOURCES) walk(s, files);
  return createHash('sha256').update(files.join('\n')).digest('hex');
}

export function buildIfNeeded(env: NodeJS.ProcessEnv) {
  const dist = path.join(root, env.NEXT_DIST_DIR ?? '.next');
  const stamp = path.join(dist, 'vineward-build.txt');
  const print = fingerprint();
  if (existsSync(path.join(dist, 'BUILD_ID')) && existsSync(stamp) && readFileSync(stamp, 'utf8') === print) {
    log('The app is already built for these sources');
    return;
  }
  log('Building the app (about a minute on 2 cores)…');
  // next build adds its build folder's types to tsconfig.json; a slot's folder must not land there.
  const tsconfig = path.join(root, 'tsconfig.json');
  const tsconfigBefore = readFileSync(tsconfig, 'utf8');
  const { atime, mtime } = statSync(tsconfig);
  try {
    // Exactly what a deployer runs, so the tests prove `npm run build` makes a whole app (worker included).
    run('npm', ['run', '--silent', 'build'], { env: { ...env, NEXT_TELEMETRY_DISABLED: '1' } });
  } finally {
    if (readFileSync(tsconfig, 'utf8') !== tsconfigBefore) {
      writeFileSync(tsconfig, tsconfigBefore);
      utimesSync(tsconfig, atime, mtime); // the build fingerprint reads mtimes: unchanged file, no rebuild
    }
  }
  writeFileSync(stamp, print);
}

export async function startNext(port: number, env: NodeJS.ProcessEnv): Promise<ChildProcess> {
  const child = spawn(process.execPath, ['node_modules/next/dist/bin/next', 'start', '-p', String(port), '-H', '127.0.0.1'], {
    cwd: root,
    env: { ...env, NEXT_TELEMETRY_DISABLED: '1', PORT: String(port) },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  track(child);
  await Promise.race([
    waitForPort(port, 60_000),
    new Promise((_, reject) => child.once('exit', (code) => reject(new Error(`next start exited with code ${code}`)))),
  ]);
  return child;
}
