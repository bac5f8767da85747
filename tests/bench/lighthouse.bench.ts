import { spawn } from 'node:child_process';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { cpus, loadavg, tmpdir } from 'node:os';
import path from 'node:path';
import { Client } from '../helpers/http';
import { median, type BenchContext } from './context';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const ALL_PAGES = ['/field', `/field/blocks/${UPPER_TERRACE}/walk?row=1&position=1`];
// LIGHTHOUSE_PAGE=walk measures only the pages whose path contains it.
const PAGES = ALL_PAGES.filter((p) => p.includes(process.env.LIGHTHOUSE_PAGE ?? ''));
const RUNS = 3;
const TARGET = { score: 90, lcpMs: 2500, tbtMs: 200 };

interface Audit {
  numericValue?: number;
}
interface Report {
  categories: { performance: { score: number | null } };
  audits: Record<string, Audit | undefined>;
  runtimeError?: { message: string };
}

/** One Lighthouse run in its own process (its Chrome is its own too), mobile preset and default throttling. */
async function lighthouse(url: string, cookie: string): Promise<Report> {
  const dir = await mkdtemp(path.join(tmpdir(), 'vineward-lh-'));
  const out = path.join(dir, 'report.json');
  try {
    await new Promise<void>((resolve, reject) => {
      const child = spawn(
        process.execPath,
        [
          'node_modules/lighthouse/cli/index.js',
          url,
          '--quiet',
          '--only-categories=performance',
          '--output=json',
          `--output-path=${out}`,
          '--chrome-flags=--headless=new --no-sandbox',
          `--extra-headers=${JSON.stringify({ Cookie: cookie })}`,
        ],
        { env: { ...process.env, CHROME_PATH: process.env.CHROME_PATH ?? '/usr/bin/chromium' }, stdio: ['ignore', 'ignore', 'inherit'] },
      );
      const timer = setTimeout(() => child.kill('SIGKILL'), 180_000);
      child.once('error', reject);
      child.once('exit', (code) => {
        clearTimeout(timer);
        if (code === 0) resolve();
        else reject(new Error(`lighthouse exited with ${code} on ${url}`));
      });
    });
    const text = await readFile(out, 'utf8');
    // LIGHTHOUSE_KEEP=<dir> keeps each report, to read what the figures are made of.
    const keep = process.env.LIGHTHOUSE_KEEP;
    if (keep) await writeFile(path.join(keep, `${new URL(url).pathname.split('/').filter(Boolean).join('-') || 'root'}-${Date.now()}.json`), text);
    return JSON.parse(text) as Report;
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

/** Lighthouse 12.2.3 mobile performance on the scout's pages, median of three runs each. */
export default async function lighthouseBench(ctx: BenchContext) {
  const scout = new Client(ctx.appUrl);
  await scout.signIn('scout@example.com', 'vineward-demo');
  if (!scout.signedIn) throw new Error('the demo scout could not sign in');
  for (const page of PAGES) {
    // One unmeasured visit, so the first run does not also pay for Next's first render of the route.
    await scout.fetch(page);
    const scores: number[] = [];
    const lcps: number[] = [];
    const tbts: number[] = [];
    const loads: number[] = [];
    for (let i = 0; i < RUNS; i++) {
      loads.push(loadavg()[0]!);
      const report = await lighthouse(new URL(page, ctx.appUrl).href, scout.cookieHeader);
      if (report.runtimeError) throw new Error(`lighthouse on ${page}: ${report.runtimeError.message}`);
      scores.push(Math.round((report.categories.performance.score ?? 0) * 100));
      lcps.push(report.audits['largest-contentful-paint']?.numericValue ?? NaN);
      tbts.push(report.audits['total-blocking-time']?.numericValue ?? NaN);
    }
    const name = page.replace(UPPER_TERRACE, '[block]');
    const score = median(scores);
    const lcp = median(lcps);
    const tbt = median(tbts);
    ctx.report(
      `lighthouse mobile ${name}: performance ${score} (target ≥ ${TARGET.score}), LCP ${(lcp / 1000).toFixed(2)} s ` +
        `(target ≤ ${TARGET.lcpMs / 1000} s), TBT ${Math.round(tbt)} ms (target ≤ ${TARGET.tbtMs} ms); median of ${RUNS}, ` +
        `runs ${scores.join('/')}, load average ${loads.map((l) => l.toFixed(1)).join('/')} on ${cpus().length} cores`,
    );
  }
}
