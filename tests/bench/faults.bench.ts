import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { resumeStorage, rss, stallStorage } from '../helpers/faults';
import { Client } from '../helpers/http';
import { smallJpeg } from '../helpers/images';
import { percentile, type BenchContext } from './context';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const STALLED_CONFIRMS = 20;
const SAMPLES = 30;
const PARALLEL = 8;
const WAVES = 2;

const p95 = (ms: number[]) =>
  percentile(
    [...ms].sort((a, b) => a - b),
    95,
  );

async function uploadOne(scout: Client, observationId: string, bytes: Buffer) {
  const id = randomUUID();
  const presign = await (await scout.json('/api/photos/presign', 'POST', { id, observationId, contentType: 'image/jpeg', bytes: bytes.length })).json();
  const put = await fetch(presign.uploadUrl, { method: 'PUT', headers: presign.headers, body: new Uint8Array(bytes) });
  if (put.status !== 200) throw new Error(`upload failed: ${put.status}`);
  return id;
}

/** A 4000 × 3000 JPEG with photo-like detail (as the photo-confirm bench). */
async function twelveMegapixel() {
  const noise = await sharp({ create: { width: 2000, height: 1500, channels: 3, background: '#6e6450', noise: { type: 'gaussian', mean: 110, sigma: 40 } } })
    .blur(0.7)
    .png()
    .toBuffer();
  return sharp(noise).resize(4000, 3000).jpeg({ quality: 88 }).toBuffer();
}

/**
 * Dependency faults: the grid and sync while photo confirms wait on a stalled object store (SIGSTOP
 * on the S3 fake), and photo confirm throughput with several at once, with the server's peak memory.
 */
export default async function faultsBench(ctx: BenchContext) {
  const scout = new Client();
  await scout.signIn('scout@example.com', 'vineward-demo');
  const observationId = randomUUID();
  await scout.json('/api/sync', 'POST', {
    observations: [
      { id: observationId, blockId: UPPER_TERRACE, row: 1, position: 1, kind: 'note', data: {}, note: 'bench', observedAt: new Date().toISOString() },
    ],
  });

  // Baseline first, then the same requests with the store stalled and 20 confirms waiting on it.
  const measure = async () => {
    const grid: number[] = [];
    const sync: number[] = [];
    for (let i = 0; i < SAMPLES; i++) {
      let t = performance.now();
      const g = await scout.fetch(`/api/grid/${UPPER_TERRACE}`, { signal: AbortSignal.timeout(30_000) });
      await g.arrayBuffer();
      grid.push(performance.now() - t);
      t = performance.now();
      const s = await scout.json('/api/sync', 'POST', {
        observations: [
          {
            id: randomUUID(),
            blockId: UPPER_TERRACE,
            row: 2,
            position: 1 + (i % 50),
            kind: 'note',
            data: {},
            note: 'stall bench',
            observedAt: new Date().toISOString(),
          },
        ],
      });
      await s.arrayBuffer();
      sync.push(performance.now() - t);
      if (g.status !== 200 || s.status !== 200) throw new Error(`grid ${g.status}, sync ${s.status} during the stall`);
    }
    return { grid: p95(grid), sync: p95(sync) };
  };
  const base = await measure();
  const ids = await Promise.all(Array.from({ length: STALLED_CONFIRMS }, async (_, i) => uploadOne(scout, observationId, await smallJpeg(i * 11))));
  stallStorage();
  let stalled: { grid: number; sync: number };
  let answers: { status: number; ms: number }[];
  try {
    const confirms = ids.map(async (id) => {
      const t = performance.now();
      const res = await scout.json('/api/photos/confirm', 'POST', { id });
      return { status: res.status, ms: performance.now() - t };
    });
    stalled = await measure();
    answers = await Promise.all(confirms);
  } finally {
    resumeStorage();
  }
  const slowest = Math.max(...answers.map((a) => a.ms));
  const statuses = [...new Set(answers.map((a) => a.status))].join('/');
  ctx.report(
    `stalled store, ${STALLED_CONFIRMS} confirms waiting: grid p95 ${stalled.grid.toFixed(0)} ms (unstalled ${base.grid.toFixed(0)} ms), ` +
      `sync p95 ${stalled.sync.toFixed(0)} ms (unstalled ${base.sync.toFixed(0)} ms); confirms answered ${statuses} within ${(slowest / 1000).toFixed(1)} s (target: grid and sync unchanged, confirms 503 < 10 s)`,
  );
  for (const id of ids) await scout.json('/api/photos/confirm', 'POST', { id });

  // Throughput: 8 confirms of 12-megapixel photos at once, twice, sampling the server's memory.
  const photo = await twelveMegapixel();
  const before = rss();
  let peak = before;
  const sampler = setInterval(() => (peak = Math.max(peak, rss())), 25);
  const started = performance.now();
  let done = 0;
  try {
    for (let w = 0; w < WAVES; w++) {
      const wave = await Promise.all(Array.from({ length: PARALLEL }, () => uploadOne(scout, observationId, photo)));
      const t = performance.now();
      const res = await Promise.all(wave.map((id) => scout.json('/api/photos/confirm', 'POST', { id })));
      if (res.some((r) => r.status !== 200)) throw new Error(`confirms: ${res.map((r) => r.status).join(',')}`);
      done += wave.length;
      ctx.report(`  wave ${w + 1}: ${PARALLEL} confirms in ${((performance.now() - t) / 1000).toFixed(2)} s`);
    }
  } finally {
    clearInterval(sampler);
  }
  const seconds = (performance.now() - started) / 1000;
  const mb = (b: number) => (b / 1024 / 1024).toFixed(0);
  ctx.report(
    `photo confirm, ${PARALLEL} at once (12 MP, ${(photo.length / 1024 / 1024).toFixed(1)} MB each): ${(done / seconds).toFixed(1)} photos/s including uploads, ` +
      `server RSS ${mb(before)} MB before, peak ${mb(peak)} MB (target: peak under 1 GB)`,
  );
}
