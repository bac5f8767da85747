import { expect, test, type Page } from '@playwright/test';
import { closeTestDb, testDb } from '../helpers/fixtures';
import { signInAs, waitForServiceWorker } from './helpers/session';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const SCOUT_ID = '8a6b2c10-1d4e-4f3a-8b7c-000000000002';

test.afterAll(closeTestDb);

/** Every URL kept in the page's runtime caches (not the build's precache, which holds no one's data). */
const cachedUrls = (page: Page) =>
  page.evaluate(async () => {
    const out: string[] = [];
    for (const name of await caches.keys()) {
      if (name.startsWith('workbox-precache')) continue;
      for (const req of await (await caches.open(name)).keys()) out.push(`${name} ${new URL(req.url).pathname}`);
    }
    return out;
  });

/** The records waiting in the phone's outbox, read straight from IndexedDB. */
const outboxIds = (page: Page) =>
  page.evaluate(
    () =>
      new Promise<string[]>((resolve, reject) => {
        const open = indexedDB.open('vineward-outbox');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const db = open.result;
          if (!db.objectStoreNames.contains('records')) return resolve([]);
          const keys = db.transaction('records').objectStore('records').getAllKeys();
          keys.onsuccess = () => resolve(keys.result.map(String));
        };
      }),
  );

test('sign-out on a shared phone clears the person’s cached pages and data, keeps an unsent record and says so', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  await page.goto(`/field/blocks/${UPPER_TERRACE}`);
  await expect(page.getByRole('heading', { name: 'Upper Terrace' })).toBeVisible();
  await page.goto('/desk');

  // The server cannot be reached for sync: the record stays in the outbox.
  await page.route('**/api/sync', (route) => route.abort('internetdisconnected'));
  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=9&position=4`);
  await expect(page.getByTestId('vine-address')).toContainText('Row 9 · Vine 4');
  await page.getByRole('button', { name: 'Weak budbreak' }).click();
  await page.getByLabel('Buds retained').fill('18');
  await page.getByLabel('Buds pushed').fill('4');
  await page.getByRole('button', { name: 'Save and next vine' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Saved on this phone' })).toBeVisible();
  await expect.poll(() => outboxIds(page)).toHaveLength(1);
  const [waitingId] = await outboxIds(page);

  // What a second person on this phone could otherwise open with no signal.
  const before = await cachedUrls(page);
  expect(before.some((u) => u.startsWith('vineward-pages /desk'))).toBe(true);
  expect(before.some((u) => u.includes(`/api/field/blocks/${UPPER_TERRACE}`))).toBe(true);
  await page.evaluate(() => localStorage.setItem('vineward-crew', '[{"email":"someone@example.com"}]'));

  await page.getByRole('button', { name: 'Sign out' }).click();
  const dialog = page.getByRole('alertdialog');
  await expect(dialog).toContainText('1 record is still waiting to be sent');
  await expect(dialog).toContainText('stays on this phone');
  await dialog.getByRole('button', { name: 'Sign out and keep it here' }).click();
  await expect(page).toHaveURL(/\/signin/);
  await expect(page.getByTestId('waiting-on-phone')).toContainText('1 record saved on this phone is waiting');

  const after = await cachedUrls(page);
  expect(
    after.filter((u) => !/^vineward-(pages \/signin|icons )/.test(u)),
    after.join('\n'),
  ).toEqual([]);
  expect(await page.evaluate(() => localStorage.getItem('vineward-crew'))).toBeNull();
  expect(await outboxIds(page)).toEqual([waitingId]);
  // Nothing personal answers from the phone either: the session is gone on the server.
  expect((await page.request.get('/api/me')).status()).toBe(401);

  // Its owner signs in again on this phone and the record goes out.
  await page.unroute('**/api/sync');
  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  await page.getByRole('button', { name: 'Sync now' }).click();
  await expect.poll(() => outboxIds(page), { timeout: 30_000 }).toEqual([]);
  expect(await testDb()('observations').where({ id: waitingId, recorded_by: SCOUT_ID })).toHaveLength(1);
});

test('sign-out with nothing waiting needs no question and leaves no cached pages', async ({ page }) => {
  await signInAs(page, 'pruner@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  await page.goto('/desk');
  expect((await cachedUrls(page)).length).toBeGreaterThan(0);
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/\/signin/);
  await expect(page.getByRole('alertdialog')).toHaveCount(0);
  await expect(page.getByTestId('waiting-on-phone')).toHaveCount(0);
  const after = await cachedUrls(page);
  expect(
    after.filter((u) => !/^vineward-(pages \/signin|icons )/.test(u)),
    after.join('\n'),
  ).toEqual([]);
});

test('a hostile callbackUrl on the sign-in page lands on this site after sign-in', async ({ page, baseURL }) => {
  await page.route(
    (url) => url.hostname.endsWith('evil.example'),
    (route) => route.fulfill({ status: 200, contentType: 'text/html', body: '<h1>Elsewhere</h1>' }),
  );
  for (const target of ['/%5Cevil.example/x', '//evil.example/x', '/%09/evil.example']) {
    await page.context().clearCookies();
    await page.goto(`/signin?callbackUrl=${target}`);
    await page.getByLabel('E-mail').fill('advisor@example.com');
    await page.getByLabel('Password').fill('vineward-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page).not.toHaveURL(/\/signin/);
    expect(new URL(page.url()).origin, target).toBe(new URL(baseURL!).origin);
  }
});
