import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { Client } from '../helpers/http';
import { median, percentile, type BenchContext } from './context';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const RUNS = 8;

/** A 4000 × 3000 (12-megapixel) JPEG with photo-like detail, lying on its side (EXIF orientation 6). */
async function twelveMegapixel() {
  const noise = await sharp({ create: { width: 2000, height: 1500, channels: 3, background: '#6e6450', noise: { type: 'gaussian', mean: 110, sigma: 40 } } })
    .blur(0.7)
    .png()
    .toBuffer();
  return sharp(noise).resize(4000, 3000).modulate({ saturation: 0.6 }).jpeg({ quality: 88 }).withMetadata({ orientation: 6 }).toBuffer();
}

/** Photo confirm (read from storage, verify, rotate, strip, thumbnail, write back) timed through the route. */
export default async function photoConfirmBench(ctx: BenchContext) {
  const scout = new Client();
  await scout.signIn('scout@example.com', 'vineward-demo');
  const photo = await twelveMegapixel();
  const observationId = randomUUID();
  await scout.json('/api/sync', 'POST', {
    observations: [
      { id: observationId, blockId: UPPER_TERRACE, row: 1, position: 1, kind: 'note', data: {}, note: 'bench', observedAt: new Date().toISOString() },
    ],
  });
  const times: number[] = [];
  for (let i = 0; i <= RUNS; i++) {
    const id = randomUUID();
    const presign = await (await scout.json('/api/photos/presign', 'POST', { id, observationId, contentType: 'image/jpeg', bytes: photo.length })).json();
    await fetch(presign.uploadUrl, { method: 'PUT', headers: presign.headers, body: new Uint8Array(photo) });
    const t = performance.now();
    const res = await scout.json('/api/photos/confirm', 'POST', { id });
    const elapsed = performance.now() - t;
    if (res.status !== 200) throw new Error(`confirm failed: ${res.status} ${await res.text()}`);
    if (i > 0) times.push(elapsed); // the first run warms sharp up
  }
  const sorted = [...times].sort((a, b) => a - b);
  ctx.report(
    `photo confirm, 12-megapixel JPEG (${(photo.length / 1024 / 1024).toFixed(1)} MB): median ${median(times).toFixed(0)} ms, ` +
      `p95 ${percentile(sorted, 95).toFixed(0)} ms (target median < 400 ms)`,
  );
}
