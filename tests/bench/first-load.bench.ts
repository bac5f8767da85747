import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { Client } from '../helpers/http';
import type { BenchContext } from './context';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const PAGES = ['/field', `/field/blocks/${UPPER_TERRACE}`, `/field/blocks/${UPPER_TERRACE}/walk?row=1&position=1`, '/field/outbox'];

/** First-load JavaScript of the scout's pages: every script the HTML asks for, gzipped, from the build. */
export default async function firstLoadBench(ctx: BenchContext) {
  const scout = new Client();
  await scout.signIn('scout@example.com', 'vineward-demo');
  for (const page of PAGES) {
    const html = await (await scout.fetch(page)).text();
    const scripts = new Set([...html.matchAll(/<script[^>]+src="\/_next\/static\/([^"]+\.js)"/g)].map((m) => m[1]!));
    let raw = 0;
    let gz = 0;
    for (const script of scripts) {
      const bytes = await readFile(path.join(ctx.distDir, 'static', script));
      raw += bytes.length;
      gz += gzipSync(bytes, { level: 9 }).length;
    }
    ctx.report(
      `first-load JS ${page.replace(UPPER_TERRACE, '[block]')}: ${(gz / 1024).toFixed(0)} KB gzipped ` +
        `(${(raw / 1024).toFixed(0)} KB raw, ${scripts.size} files; target < 200 KB, ratio ${(gz / 1024 / 200).toFixed(2)} of target)`,
    );
  }
}
