import { expect, test, type Page } from '@playwright/test';
import { signInAs, waitForServiceWorker } from './helpers/session';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';

/** Chromium reports every script or style the page's CSP refused on the console. */
function cspRefusals(page: Page) {
  const refused: string[] = [];
  page.on('console', (message) => {
    if (/Content Security Policy/i.test(message.text())) refused.push(`${page.url()}: ${message.text()}`);
  });
  return refused;
}

test('pages run under the nonce CSP online, as offline copies from the service worker, and as the offline page', async ({ page, context }) => {
  const refused = cspRefusals(page);
  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  const walk = `/field/blocks/${UPPER_TERRACE}/walk?row=3&position=2`;
  await page.goto(walk);
  await expect(page.getByTestId('vine-address')).toContainText('Row 3 · Vine 2');
  await expect(page.getByTestId('connection')).not.toHaveText('Offline');

  await context.setOffline(true);
  // The copy the service worker kept, with the nonce of the response it came from: its scripts run.
  await page.reload();
  await expect(page.getByTestId('vine-address')).toContainText('Row 3 · Vine 2');
  await expect(page.getByTestId('connection')).toHaveText('Offline');
  await page.getByRole('button', { name: 'Weak budbreak' }).click();
  await expect(page.getByLabel('Buds retained')).toBeVisible();
  // A page never opened: the precached offline page.
  await page.goto('/field/blocks/00000000-0000-4000-8000-000000000000');
  await expect(page.getByRole('heading', { name: /No signal, and this page was not opened before/ })).toBeVisible();
  await context.setOffline(false);

  await page.goto('/signin');
  await page.goto('/desk');
  expect(refused).toEqual([]);
});
