import { expect, test, type Page } from '@playwright/test';
import { resumeStorage, stallStorage, startStorage, stopStorage } from '../helpers/faults';
import { closeTestDb, testDb } from '../helpers/fixtures';
import { objectExists } from '../helpers/s3';
import { testPhoto } from './helpers/photos';
import { signInAs, waitForServiceWorker, waitingOnPhone } from './helpers/session';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';

test.afterAll(async () => {
  resumeStorage();
  await startStorage();
  await closeTestDb();
});

async function recordWithPhoto(page: Page, row: number, label: string) {
  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=${row}&position=1`);
  await expect(page.getByTestId('vine-address')).toContainText(`Row ${row} · Vine 1`);
  await page.getByRole('button', { name: 'Weak budbreak' }).click();
  await page.getByLabel('Buds retained').fill('24');
  await page.getByLabel('Buds pushed').fill('9');
  await page.getByTestId('photo-input').setInputFiles(await testPhoto(label));
  await expect(page.getByTestId('photo-count')).toHaveText('1 photo');
  await page.getByRole('button', { name: 'Save and next vine' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Saved on this phone' })).toBeVisible();
}

async function photosOfRow(row: number, since: Date) {
  const observations = await testDb()('observations').where({ block_id: UPPER_TERRACE, row_number: row, position: 1 }).where('received_at', '>=', since);
  expect(observations).toHaveLength(1);
  return testDb()('photos').where({ observation_id: observations[0].id });
}

test('a photo confirmed while storage stalls stays on the phone and arrives exactly once when storage answers again', async ({ page }) => {
  test.setTimeout(120_000);
  const started = new Date();
  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);

  // The upload reaches storage; then storage hangs just as the phone asks the server to confirm.
  let stalled = 0;
  await page.route('**/api/photos/confirm', async (route) => {
    if (stalled++ === 0) stallStorage();
    await route.continue();
  });
  const refused = page.waitForResponse((r) => r.url().endsWith('/api/photos/confirm'), { timeout: 30_000 });
  await recordWithPhoto(page, 11, 'stalled');
  await page.getByRole('button', { name: 'Sync now' }).click();
  const answer = await refused;
  try {
    expect(answer.status()).toBe(503);
    expect(answer.headers()['retry-after']).toBeTruthy();
    await expect.poll(() => waitingOnPhone(page)).toEqual({ records: 0, photos: 1 });
    expect((await photosOfRow(11, started)).map((p) => p.status)).toEqual(['pending']);
  } finally {
    resumeStorage();
  }

  await page.getByRole('button', { name: 'Sync now' }).click();
  await expect.poll(() => waitingOnPhone(page), { timeout: 60_000 }).toEqual({ records: 0, photos: 0 });
  const photos = await photosOfRow(11, started);
  expect(photos).toHaveLength(1);
  expect(photos[0].status).toBe('stored');
  expect(await objectExists(photos[0].object_key)).toBe(true);
  expect(await objectExists(photos[0].upload_key)).toBe(false);
});

test('a photo taken while storage is down waits on the phone and arrives exactly once when it is back', async ({ page }) => {
  test.setTimeout(120_000);
  const started = new Date();
  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  stopStorage();
  try {
    await recordWithPhoto(page, 12, 'down');
    await page.getByRole('button', { name: 'Sync now' }).click();
    // The record went; the photo could not reach storage and stays queued.
    await expect.poll(() => waitingOnPhone(page), { timeout: 30_000 }).toEqual({ records: 0, photos: 1 });
  } finally {
    await startStorage();
  }
  await page.getByRole('button', { name: 'Sync now' }).click();
  await expect.poll(() => waitingOnPhone(page), { timeout: 60_000 }).toEqual({ records: 0, photos: 0 });
  const photos = await photosOfRow(12, started);
  expect(photos).toHaveLength(1);
  expect(photos[0].status).toBe('stored');
  expect(await objectExists(photos[0].object_key)).toBe(true);
});
