import { expect, test, type Locator } from '@playwright/test';
import { signInAs, waitForServiceWorker } from './helpers/session';

async function imageLoaded(image: Locator) {
  await expect.poll(() => image.evaluate((img: HTMLImageElement) => (img.complete ? img.naturalWidth : 0)), { timeout: 10_000 }).toBeGreaterThan(0);
}

test('the photo log loads more thumbnails as it scrolls, opens one full size and leads to its vine on the grid', async ({ page }) => {
  await signInAs(page, 'advisor@example.com');
  await waitForServiceWorker(page);
  // The advisor's other client has no photos yet; the log says so rather than showing the estate's.
  await page.goto('/photos');
  await expect(page.getByText('No photos match these filters.')).toBeVisible();
  await page.getByLabel('Organisation').selectOption({ label: 'Ninefold Ridge Estate (advisor)' });
  await expect(page).toHaveURL(/\/desk$/);
  await page.goto('/photos');
  const thumbs = page.getByTestId('photo-log').getByRole('img');
  await expect(thumbs).toHaveCount(30);
  // The thumbnails are the small copies, not the originals.
  await imageLoaded(thumbs.first());
  expect(await thumbs.first().evaluate((img: HTMLImageElement) => Math.max(img.naturalWidth, img.naturalHeight))).toBe(320);

  // Other tests add photos too, so scroll page after page until the log says it has them all.
  const end = page.getByText('That is every photo that matches.');
  for (let pages = 1; pages < 20 && !(await end.isVisible()); pages++) {
    await end
      .or(page.getByRole('button', { name: 'Load more photos' }))
      .first()
      .scrollIntoViewIfNeeded();
    await expect.poll(async () => (await end.isVisible()) || (await thumbs.count()) > pages * 30).toBe(true);
  }
  await expect(end).toBeVisible();
  expect(await thumbs.count()).toBeGreaterThan(30);

  await page.getByTestId('photo-log').getByRole('button').first().click();
  const viewer = page.getByRole('dialog');
  await imageLoaded(viewer.getByRole('img'));
  expect(await viewer.getByRole('img').evaluate((img: HTMLImageElement) => img.naturalWidth)).toBeGreaterThan(320);
  const heading = await viewer.getByRole('heading', { level: 2 }).textContent();
  await viewer.getByRole('link', { name: 'Show this vine on the grid' }).click();
  await expect(page).toHaveURL(/\/grid\/[0-9a-f-]+\?row=\d+&position=\d+$/);
  await expect(page.getByTestId('vine-panel').getByTestId('vine-observation').filter({ hasText: heading! }).first()).toBeVisible();
});

test('filters narrow the photo log and stay in the address', async ({ page }) => {
  await signInAs(page, 'manager@example.com');
  await waitForServiceWorker(page);
  await page.goto('/photos');
  await page.getByText('Filters:').click();
  await page.getByLabel('Kind').selectOption({ label: 'Trunk injury' });
  await page.getByLabel('Severity').selectOption({ label: 'Act now' });
  await expect(page).toHaveURL(/kind=trunk-injury&severity=3/);
  const cards = page.getByTestId('photo-log').getByRole('listitem');
  await expect(cards.first()).toContainText('Trunk injury');
  const texts = await cards.allTextContents();
  expect(texts.length).toBeGreaterThan(3);
  expect(texts.every((t) => t.startsWith('Trunk injury'))).toBe(true);

  await page.reload();
  await expect(page.getByLabel('Kind')).toHaveValue('trunk-injury');
  await expect(cards).toHaveCount(texts.length);
});
