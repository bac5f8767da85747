import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { expect, test } from '@playwright/test';
import { signInAs, waitForServiceWorker } from './helpers/session';

// The app serves the worker from its build folder on every request (app/sw.js/route.ts).
const workerFile = path.join(process.cwd(), process.env.NEXT_DIST_DIR || '.next', 'sw.js');

test('when a new service worker is waiting, the page offers to reload instead of swapping silently', async ({ page }) => {
  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  await expect(page.getByTestId('sw-update')).toHaveCount(0);

  // Change the worker on the server, as a new deployment would, and let the page look for it.
  const original = readFileSync(workerFile, 'utf8');
  try {
    writeFileSync(workerFile, `${original}\n// next version ${Date.now()}`);
    await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())?.update());
    const prompt = page.getByTestId('sw-update');
    await expect(prompt).toContainText('A new version of Vineward is ready.');
    const reloaded = page.waitForEvent('load');
    await prompt.getByRole('button', { name: 'Reload' }).click();
    await reloaded;
    await expect(page.getByTestId('sw-update')).toHaveCount(0);
  } finally {
    writeFileSync(workerFile, original);
  }
});
