import { expect, test, type Page } from '@playwright/test';
import { closeTestDb, testDb } from '../helpers/fixtures';
import { objectExists } from '../helpers/s3';
import { testPhoto } from './helpers/photos';
import { signInAs, waitForServiceWorker, waitingOnPhone } from './helpers/session';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const SCOUT_ID = '8a6b2c10-1d4e-4f3a-8b7c-000000000002';

test.afterAll(closeTestDb);

async function recordBudbreak(page: Page, retained: number, pushed: number, photo?: Awaited<ReturnType<typeof testPhoto>>) {
  await page.getByRole('button', { name: 'Weak budbreak' }).click();
  await page.getByLabel('Buds retained').fill(String(retained));
  await page.getByLabel('Buds pushed').fill(String(pushed));
  await expect(page.getByTestId('budbreak-feedback')).toContainText(`Budbreak ${Math.round((pushed / retained) * 100)}%`);
  if (photo) {
    await page.getByTestId('photo-input').setInputFiles(photo);
    await expect(page.getByTestId('photo-count')).toHaveText('1 photo');
  }
  await page.getByRole('button', { name: 'Save and next vine' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Saved on this phone' })).toBeVisible();
}

test('a scout walks a row with no signal, reloads twice, and everything arrives once when back in range', async ({ page, context }) => {
  test.setTimeout(240_000);
  const started = new Date();
  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  // Open the block once online so that the phone keeps its layout.
  await page.goto(`/field/blocks/${UPPER_TERRACE}`);
  await expect(page.getByRole('heading', { name: 'Upper Terrace' })).toBeVisible();
  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=5&position=1`);
  await expect(page.getByTestId('vine-address')).toContainText('Row 5 · Vine 1');

  await context.setOffline(true);
  await page.reload();
  await expect(page.getByTestId('vine-address')).toContainText('Row 5 · Vine 1');
  await expect(page.getByTestId('connection')).toHaveText('Offline');

  for (let i = 0; i < 30; i++) {
    const photo = i % 6 === 0 ? await testPhoto(`r5v${i + 1}`) : undefined;
    await recordBudbreak(page, 20 + (i % 7), 5 + (i % 11), photo);
    await expect(page.getByTestId('vine-address')).toContainText(`Row 5 · Vine ${i + 2}`);
  }
  // The status bar counts the outbox a moment after each save.
  await expect.poll(() => waitingOnPhone(page)).toEqual({ records: 30, photos: 5 });

  await page.reload();
  await expect(page.getByTestId('vine-address')).toBeVisible();
  await expect.poll(() => waitingOnPhone(page)).toEqual({ records: 30, photos: 5 });

  await context.setOffline(false);
  await page.getByRole('button', { name: 'Sync now' }).click();
  await expect.poll(() => waitingOnPhone(page), { timeout: 90_000 }).toEqual({ records: 0, photos: 0 });

  const stored = await testDb()('observations').where({ block_id: UPPER_TERRACE, recorded_by: SCOUT_ID, row_number: 5 }).where('received_at', '>=', started);
  expect(stored).toHaveLength(30);
  expect(new Set(stored.map((o) => o.position))).toEqual(new Set(Array.from({ length: 30 }, (_, i) => i + 1)));
  const photos = await testDb()('photos').whereIn(
    'observation_id',
    stored.map((o) => o.id),
  );
  expect(photos).toHaveLength(5);
  for (const p of photos) {
    expect(p.status).toBe('stored');
    expect(Math.max(p.width, p.height)).toBe(2048);
    expect(await objectExists(p.object_key)).toBe(true);
    expect(await objectExists(p.thumb_key)).toBe(true);
  }
});

test('a batch whose answer is lost after the server stored it is resent without duplicates', async ({ page }) => {
  test.setTimeout(120_000);
  const started = new Date();
  await signInAs(page, 'scout@example.com');
  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=7&position=1`);
  await expect(page.getByTestId('vine-address')).toContainText('Row 7 · Vine 1');
  await waitForServiceWorker(page);

  let dropped = 0;
  await page.route('**/api/sync', async (route) => {
    if (dropped === 0) {
      dropped++;
      await route.fetch(); // the server commits the batch…
      await route.abort('connectionreset'); // …and the phone never hears back.
      return;
    }
    await route.continue();
  });
  await context(page).setOffline(true);
  for (let i = 0; i < 4; i++) await recordBudbreak(page, 24, 10 + i);
  await context(page).setOffline(false);
  await page.getByRole('button', { name: 'Sync now' }).click();
  await expect.poll(() => waitingOnPhone(page), { timeout: 60_000 }).toEqual({ records: 0, photos: 0 });
  expect(dropped).toBe(1);

  const stored = await testDb()('observations').where({ block_id: UPPER_TERRACE, row_number: 7 }).where('received_at', '>=', started);
  expect(stored).toHaveLength(4);
});

test('a session that ends while offline keeps the queue; after signing in again it syncs', async ({ page }) => {
  test.setTimeout(120_000);
  const started = new Date();
  await signInAs(page, 'scout@example.com');
  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=9&position=1`);
  await expect(page.getByTestId('vine-address')).toContainText('Row 9 · Vine 1');
  await waitForServiceWorker(page);
  await context(page).setOffline(true);
  await recordBudbreak(page, 30, 12);
  await recordBudbreak(page, 30, 13);
  await context(page).clearCookies();
  await context(page).setOffline(false);
  await page.getByRole('button', { name: 'Sync now' }).click();
  await expect(page.getByText('Your session ended')).toBeVisible();
  await expect.poll(() => waitingOnPhone(page)).toEqual({ records: 2, photos: 0 });

  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  await expect.poll(() => waitingOnPhone(page), { timeout: 60_000 }).toEqual({ records: 0, photos: 0 });
  const stored = await testDb()('observations').where({ block_id: UPPER_TERRACE, row_number: 9 }).where('received_at', '>=', started);
  expect(stored).toHaveLength(2);
});

const context = (page: Page) => page.context();
