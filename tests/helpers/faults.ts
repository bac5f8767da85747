/**
 * Fault injection against the services `npm test` started (their process ids and folders come in
 * through the environment, see scripts/test.ts): stall or stop the S3 fake, stall the SMTP fake,
 * stop and start PostgreSQL, run a second app server of our own.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { waitForPort } from '../../scripts/lib/services';

function pid(name: 'S3_PID' | 'SMTP_PID' | 'APP_PID') {
  const value = Number(process.env[name]);
  if (!value) throw new Error(`${name} is not set: run the fault tests through \`npm test\`, with the local fakes`);
  return value;
}

const signal = (name: 'S3_PID' | 'SMTP_PID', sig: NodeJS.Signals) => process.kill(pid(name), sig);

/** The store accepts connections (the kernel does) and never answers, like a hung server. */
export const stallStorage = () => signal('S3_PID', 'SIGSTOP');
export const resumeStorage = () => signal('S3_PID', 'SIGCONT');
/** The store goes away: connections are refused. */
export const stopStorage = () => signal('S3_PID', 'SIGUSR1');
export async function startStorage() {
  signal('S3_PID', 'SIGUSR2');
  await waitForPort(Number(new URL(process.env.S3_ENDPOINT!).port));
}
export const stallMail = () => signal('SMTP_PID', 'SIGSTOP');
export const resumeMail = () => signal('SMTP_PID', 'SIGCONT');

/** pg_ctl, run asynchronously so that the test's own requests go on meanwhile. */
function pgCtl(args: string[]) {
  const data = process.env.PG_DATA;
  const bin = process.env.PG_BIN;
  if (!data || !bin) throw new Error('PG_DATA and PG_BIN are not set: run the fault tests through `npm test` with its own PostgreSQL');
  const tool = path.join(bin, 'pg_ctl');
  const [cmd, cmdArgs] = process.getuid?.() === 0 ? ['runuser', ['-u', 'postgres', '--', tool, '-D', data, ...args]] : [tool, ['-D', data, ...args]];
  return new Promise<void>((resolve, reject) => {
    const child = spawn(cmd as string, cmdArgs as string[], { stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr!.on('data', (b: Buffer) => (stderr += b.toString()));
    child.once('exit', (code) => (code === 0 ? resolve() : reject(new Error(`pg_ctl ${args.join(' ')} failed: ${stderr}`))));
  });
}

let pgOptions: string | undefined;

/**
 * Stops PostgreSQL as a restart does: open transactions are cut and rolled back. Not "immediate":
 * the test cluster runs with synchronous_commit off, so a crash would lose commits the app had
 * already been told about, which a production server (synchronous_commit on) never does.
 */
export function stopPostgres() {
  // The server's own command line, to start it again the same way.
  const opts = readFileSync(path.join(process.env.PG_DATA!, 'postmaster.opts'), 'utf8');
  const args = [...opts.matchAll(/"([^"]*)"/g)].map((m) => m[1]!);
  const i = args.indexOf('-D');
  if (i >= 0) args.splice(i, 2);
  pgOptions = args.map((a) => `'${a}'`).join(' ');
  return pgCtl(['stop', '-m', 'fast', '-w']);
}

export function startPostgres() {
  return pgCtl(['start', '-w', '-l', path.join(process.env.PG_DATA!, '..', 'postgres.log'), ...(pgOptions ? ['-o', pgOptions] : [])]);
}

/** A second app server on the slot's spare port, same build and environment as the suite's. */
export async function startSpareApp(): Promise<{ child: ChildProcess; url: string }> {
  const port = Number(process.env.SPARE_APP_PORT);
  if (!port) throw new Error('SPARE_APP_PORT is not set: run the fault tests through `npm test`');
  const child = spawn(process.execPath, ['node_modules/next/dist/bin/next', 'start', '-p', String(port), '-H', '127.0.0.1'], {
    env: { ...process.env, PORT: String(port) },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  await Promise.race([
    waitForPort(port, 60_000),
    new Promise((_, reject) => child.once('exit', (code) => reject(new Error(`the spare app server exited with code ${code}`)))),
  ]);
  return { child, url: `http://127.0.0.1:${port}` };
}

/** Resident memory of a process in bytes (Linux), for peak-memory checks. */
export function rss(processId = pid('APP_PID')) {
  const status = readFileSync(`/proc/${processId}/status`, 'utf8');
  return Number(status.match(/VmRSS:\s+(\d+) kB/)![1]) * 1024;
}

/** Times a request; aborted after `timeoutMs` so that a hang fails the test instead of stalling it. */
export async function timed(run: (signal: AbortSignal) => Promise<Response>, timeoutMs = 15_000) {
  const started = performance.now();
  try {
    const res = await run(AbortSignal.timeout(timeoutMs));
    const text = await res.text();
    return { status: res.status, ms: performance.now() - started, headers: res.headers, text, json: () => JSON.parse(text) };
  } catch (err) {
    return { status: 0, ms: performance.now() - started, headers: new Headers(), text: String(err), json: () => undefined };
  }
}
