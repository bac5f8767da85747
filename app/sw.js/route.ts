import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { envSetting } from '@/lib/env';

// Served from the build folder (see scripts/build-service-worker.ts); never cached by the browser,
// so a new build's worker is found on the next visit.
export async function GET() {
  const file = path.join(process.cwd(), envSetting('NEXT_DIST_DIR'), 'sw.js');
  try {
    return new Response(await readFile(file), {
      headers: { 'content-type': 'application/javascript; charset=utf-8', 'cache-control': 'no-cache', 'service-worker-allowed': '/' },
    });
  } catch {
    return new Response('// No service worker in this build.', { status: 404, headers: { 'content-type': 'application/javascript' } });
  }
}
