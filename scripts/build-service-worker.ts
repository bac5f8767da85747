/**
 * Builds the service worker after `next build`: bundles service-worker/sw.ts with esbuild, then
 * lets workbox-build list the build's static files (with revisions) into it. The result goes into
 * the build folder (not public/), and app/sw.js/route.ts serves it, so parallel builds never mix.
 */
import { createHash } from 'node:crypto';
import { readFileSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { build } from 'esbuild';
import { injectManifest } from 'workbox-build';

const root = path.resolve(__dirname, '..');
const dist = path.join(root, process.env.NEXT_DIST_DIR || '.next');

function publicEntries() {
  const dir = path.join(root, 'public');
  const out: { url: string; revision: string }[] = [];
  const walk = (rel: string) => {
    for (const name of readdirSync(path.join(dir, rel))) {
      const file = path.join(rel, name);
      if (statSync(path.join(dir, file)).isDirectory()) walk(file);
      else
        out.push({
          url: `/${file.split(path.sep).join('/')}`,
          revision: createHash('md5')
            .update(readFileSync(path.join(dir, file)))
            .digest('hex'),
        });
    }
  };
  walk('');
  return out;
}

async function main() {
  const buildId = readFileSync(path.join(dist, 'BUILD_ID'), 'utf8').trim();
  const bundled = path.join(dist, 'sw.bundle.js');
  await build({
    entryPoints: [path.join(root, 'service-worker/sw.ts')],
    outfile: bundled,
    bundle: true,
    format: 'iife',
    minify: true,
    target: 'es2020',
    define: { 'process.env.NODE_ENV': '"production"' },
    logLevel: 'warning',
  });
  const { count, size, warnings } = await injectManifest({
    swSrc: bundled,
    swDest: path.join(dist, 'sw.js'),
    globDirectory: path.join(dist, 'static'),
    globPatterns: ['**/*.{js,css,woff2,woff,png,svg,ico}'],
    modifyURLPrefix: { '': '/_next/static/' },
    maximumFileSizeToCacheInBytes: 5 * 1024 * 1024,
    additionalManifestEntries: [{ url: '/offline', revision: buildId }, ...publicEntries()],
  });
  for (const w of warnings) console.warn(w);
  console.log(`Service worker: ${count} files precached (${(size / 1024).toFixed(0)} KB)`);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
