/**
 * Many people at once: simulated devices syncing batches and managers reading grids, against one
 * app server, then through HAProxy (Debian's package, installed when missing) on loopback, first
 * in front of that one server and then in front of two on the same database.
 */
import { randomUUID } from 'node:crypto';
import { writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import path from 'node:path';
import { spawn, type ChildProcess } from 'node:child_process';
import { startNext } from '../../scripts/lib/app';
import { PROFILES } from '../../scripts/lib/profile';
import { ensureHaproxy, stopChild, track, waitForPort } from '../../scripts/lib/services';
import { Client } from '../helpers/http';
import { percentile, type BenchContext } from './context';
import type { Estate } from './estate';

const DEVICES = 50;
const MANAGERS = 10;
const DEVICE_BATCH = 25;

function startProxy(port: number, backends: number[], dir: string): Promise<ChildProcess> {
  const file = path.join(dir, 'haproxy-bench.cfg');
  writeFileSync(
    file,
    [
      'global',
      '  maxconn 2000',
      'defaults',
      '  mode http',
      '  timeout connect 5s',
      '  timeout client 60s',
      '  timeout server 60s',
      '  option http-keep-alive',
      'frontend app',
      `  bind 127.0.0.1:${port}`,
      '  default_backend servers',
      'backend servers',
      '  balance leastconn',
      ...backends.map((p, i) => `  server app${i + 1} 127.0.0.1:${p}`),
      '',
    ].join('\n'),
  );
  const child = spawn(ensureHaproxy(), ['-db', '-f', file], { stdio: ['ignore', 'ignore', 'inherit'] });
  track(child);
  return waitForPort(port, 10_000).then(() => child);
}

interface Run {
  syncMs: number[];
  gridMs: number[];
  observations: number;
  failures: number;
  seconds: number;
}

async function drive(base: string, cookies: { scout: string; manager: string }, estate: Estate, seconds: number): Promise<Run> {
  const run: Run = { syncMs: [], gridMs: [], observations: 0, failures: 0, seconds };
  const until = performance.now() + seconds * 1000;
  const side = estate.size.side;
  const device = async (d: number) => {
    while (performance.now() < until) {
      const blockId = estate.blockIds[d % estate.blockIds.length]!;
      const observations = Array.from({ length: DEVICE_BATCH }, (_, i) => ({
        id: randomUUID(),
        blockId,
        row: 1 + ((d * 7 + i) % side),
        position: 1 + ((d * 13 + i * 3) % side),
        kind: 'note',
        data: {},
        note: `load ${d}`,
        observedAt: new Date().toISOString(),
      }));
      const t = performance.now();
      const res = await fetch(`${base}/api/sync`, {
        method: 'POST',
        headers: { cookie: cookies.scout, 'content-type': 'application/json' },
        body: JSON.stringify({ observations }),
      }).catch(() => undefined);
      const ok = res?.status === 200 && ((await res.json()) as { results: { status: string }[] }).results.every((r) => r.status === 'created');
      run.syncMs.push(performance.now() - t);
      if (ok) run.observations += DEVICE_BATCH;
      else run.failures++;
    }
  };
  const manager = async (m: number) => {
    let i = m;
    while (performance.now() < until) {
      const t = performance.now();
      const res = await fetch(`${base}/api/grid/${estate.blockIds[i++ % estate.blockIds.length]}`, { headers: { cookie: cookies.manager } }).catch(
        () => undefined,
      );
      if (res) await res.arrayBuffer();
      run.gridMs.push(performance.now() - t);
      if (res?.status !== 200) run.failures++;
    }
  };
  await Promise.all([...Array.from({ length: DEVICES }, (_, d) => device(d)), ...Array.from({ length: MANAGERS }, (_, m) => manager(m))]);
  return run;
}

function report(ctx: BenchContext, label: string, r: Run) {
  const s = [...r.syncMs].sort((a, b) => a - b);
  const g = [...r.gridMs].sort((a, b) => a - b);
  ctx.report(
    `load, ${label}: ${DEVICES} devices syncing ${DEVICE_BATCH}-record batches and ${MANAGERS} managers reading grids for ${r.seconds} s: ` +
      `sync p95 ${percentile(s, 95).toFixed(0)} ms (median ${percentile(s, 50).toFixed(0)} ms), ${(s.length / r.seconds).toFixed(1)} batches/s, ${(r.observations / r.seconds).toFixed(0)} observations/s; ` +
      `grid p95 ${percentile(g, 95).toFixed(0)} ms (median ${percentile(g, 50).toFixed(0)} ms), ${(g.length / r.seconds).toFixed(1)} grids/s; ${r.failures} failed; load average ${loadavg()[0]!.toFixed(2)}`,
  );
}

export async function underLoad(ctx: BenchContext, estate: Estate) {
  const profile = PROFILES.test;
  const seconds = ctx.scale === 'full' ? 20 : 8;
  const scout = new Client();
  await scout.signIn(estate.scoutEmail, 'vineward-demo');
  const manager = new Client();
  await manager.signIn(estate.managerEmail, 'vineward-demo');
  // A session is a signed cookie (JWT): the same one works on every server and through the proxy.
  const cookies = { scout: scout.cookieHeader, manager: manager.cookieHeader };

  report(ctx, '1 server, direct', await drive(ctx.appUrl.replace('localhost', '127.0.0.1'), cookies, estate, seconds));

  const proxyPort = profile.appPort + 6;
  const secondPort = profile.appPort + 5;
  let proxy = await startProxy(proxyPort, [profile.appPort], profile.dir);
  let second: ChildProcess | undefined;
  try {
    report(ctx, '1 server behind HAProxy', await drive(`http://127.0.0.1:${proxyPort}`, cookies, estate, seconds));
    await stopChild(proxy);
    second = await startNext(secondPort, ctx.env);
    proxy = await startProxy(proxyPort, [profile.appPort, secondPort], profile.dir);
    // The second server's first requests compile and connect; not part of the figure.
    await drive(`http://127.0.0.1:${secondPort}`, cookies, estate, 2);
    report(ctx, '2 servers behind HAProxy', await drive(`http://127.0.0.1:${proxyPort}`, cookies, estate, seconds));
  } finally {
    await stopChild(proxy);
    if (second) await stopChild(second);
  }
}
