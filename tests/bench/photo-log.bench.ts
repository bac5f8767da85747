import { chromium, type Request } from '@playwright/test';
import playwrightConfig from '../../playwright.config';
import type { BenchContext } from './context';

const SHOWN = 60;
const COPY_MARK = 'bench-copy';

/** The demo has a few dozen photos; more rows over the same stored objects make up a full page of 60. */
async function enoughPhotos(ctx: BenchContext) {
  const { db } = ctx;
  await db('photos').where({ sha256: COPY_MARK }).delete();
  const org = (await db('organisations').where({ name: 'Ninefold Ridge Estate' }).first('id')).id as string;
  const stored = Number((await db('photos').where({ organisation_id: org, status: 'stored' }).count({ n: '*' }).first())!.n);
  if (stored < SHOWN) {
    await db.raw(
      `insert into photos (id, organisation_id, observation_id, uploaded_by, status, object_key, thumb_key, content_type, bytes, width, height, sha256, taken_at, stored_at)
       select gen_random_uuid(), organisation_id, observation_id, uploaded_by, 'stored', object_key, thumb_key, content_type, bytes, width, height, ?,
              taken_at - interval '1 year', stored_at
       from photos where organisation_id = ? and status = 'stored' order by id limit ?`,
      [COPY_MARK, org, SHOWN - stored],
    );
  }
  return org;
}

const kb = (bytes: number) => `${(bytes / 1024).toFixed(0)} KB`;

/** Bytes a phone downloads for the first 60 thumbnails of the photo log: thumbnails, never originals. */
export default async function photoLogBench(ctx: BenchContext) {
  const org = await enoughPhotos(ctx);
  const storeOrigin = new URL(ctx.env.S3_ENDPOINT!).origin;
  const browser = await chromium.launch(playwrightConfig.use?.launchOptions);
  try {
    // No service worker: every byte is fetched and counted.
    const context = await browser.newContext({
      baseURL: ctx.appUrl,
      viewport: { width: 360, height: 740 },
      isMobile: true,
      hasTouch: true,
      serviceWorkers: 'block',
    });
    const page = await context.newPage();
    await page.goto('/signin');
    await page.getByLabel('E-mail').fill('manager@example.com');
    await page.getByLabel('Password').fill('vineward-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/desk/);

    const requests: Request[] = [];
    page.on('request', (r) => requests.push(r));
    await page.goto('/photos');
    const images = page.getByTestId('photo-log').getByRole('img');
    await images.nth(29).waitFor();
    await page.getByRole('button', { name: 'Load more photos' }).scrollIntoViewIfNeeded();
    await images.nth(SHOWN - 1).waitFor();
    for (let i = 0; i < SHOWN; i++) await images.nth(i).scrollIntoViewIfNeeded();
    await page.waitForFunction(
      (n) => [...document.querySelectorAll<HTMLImageElement>('[data-testid="photo-log"] img')].slice(0, n).every((img) => img.complete && img.naturalWidth > 0),
      SHOWN,
    );
    await page.waitForLoadState('networkidle');

    let thumbs = 0;
    let thumbBytes = 0;
    let largest = 0;
    let redirectBytes = 0;
    let listBytes = 0;
    let originals = 0;
    for (const r of requests) {
      const url = new URL(r.url());
      const sizes = await r.sizes().catch(() => null);
      if (!sizes) continue;
      const size = sizes.responseBodySize + sizes.responseHeadersSize;
      if (url.origin === storeOrigin) {
        if (url.pathname.endsWith('.thumb.jpg')) {
          thumbs++;
          thumbBytes += size;
          largest = Math.max(largest, size);
        } else originals++;
      } else if (/^\/api\/photos\/[0-9a-f-]{36}$/.test(url.pathname)) redirectBytes += size;
      else if (url.pathname === '/api/photos') listBytes += size;
    }
    const ids = await page.evaluate(
      (n) =>
        [...document.querySelectorAll<HTMLImageElement>('[data-testid="photo-log"] img')].slice(0, n).map((img) => new URL(img.src).pathname.split('/').pop()!),
      SHOWN,
    );
    const originalBytes = Number((await ctx.db('photos').where({ organisation_id: org }).whereIn('id', ids).sum({ n: 'bytes' }).first())!.n);
    ctx.report(
      `photo log, first ${SHOWN} thumbnails on a phone: ${kb(thumbBytes)} of images from storage (${thumbs} thumbnails, ${kb(thumbBytes / Math.max(1, thumbs))} each on average, ` +
        `largest ${kb(largest)}; the same ${SHOWN} originals are ${kb(originalBytes)}, ratio ${(thumbBytes / originalBytes).toFixed(2)}); ` +
        `${originals} originals downloaded (target 0); ${kb(redirectBytes)} of signed-link redirects; ${kb(listBytes)} of list JSON`,
    );
    await context.close();
  } finally {
    await browser.close();
    await ctx.db('photos').where({ sha256: COPY_MARK }).delete();
  }
}
