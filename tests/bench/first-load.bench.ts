import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { Client } from '../helpers/http';
import type { BenchContext } from './context';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const PAGES = ['/offline', '/field', `/field/blocks/${UPPER_TERRACE}`, `/field/blocks/${UPPER_TERRACE}/walk?row=1&position=1`, '/field/outbox'];

const MARKERS = ['react-dom', 'ZodType', 'IntlMessageFormat', 'QueryClient', 'workbox', 'idb-keyval', 'useForm', 'recharts', 'next-auth'];

/** First-load JavaScript of the scout's pages: every script the HTML asks for, gzipped, from the build. */
export default async function firstLoadBench(ctx: BenchContext) {
  const scout = new Client();
  await scout.signIn('scout@example.com', 'vineward-demo');
  for (const page of PAGES) {
    const html = await (await scout.fetch(page)).text();
    // Legacy-browser polyfills (noModule) are never fetched by the phones this app supports.
    const tags = [...html.matchAll(/<script[^>]*>/g)].map((m) => m[0]).filter((tag) => !/nomodule/i.test(tag));
    const scripts = new Set(tags.flatMap((tag) => tag.match(/src="\/_next\/static\/([^"]+\.js)"/)?.slice(1) ?? []));
    let raw = 0;
    let gz = 0;
    const detail: string[] = [];
    for (const script of scripts) {
      const bytes = await readFile(path.join(ctx.distDir, 'static', script));
      const size = gzipSync(bytes, { level: 9 }).length;
      raw += bytes.length;
      gz += size;
      const text = bytes.toString();
      detail.push(`${(size / 1024).toFixed(1).padStart(6)} KB ${script} ${MARKERS.filter((m) => text.includes(m)).join(' ')}`);
    }
    // VINEWARD_BENCH_DETAIL=1 lists each file with the libraries it seems to hold.
    if (process.env.VINEWARD_BENCH_DETAIL) console.log(detail.sort().reverse().join('\n'));
    ctx.report(
      `first-load JS ${page.replace(UPPER_TERRACE, '[block]')}: ${(gz / 1024).toFixed(0)} KB gzipped ` +
        `(${(raw / 1024).toFixed(0)} KB raw, ${scripts.size} files; target < 200 KB, ratio ${(gz / 1024 / 200).toFixed(2)} of target)`,
    );
  }
}
