import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, expect, test } from '@playwright/test';
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

test('Chromium finds the app installable: manifest, icons and a controlling service worker', async ({ browserName }, testInfo) => {
  // Install prompts never appear in incognito windows, and every Playwright context is one: use a
  // profile on disk, as a phone's browser has.
  const profile = mkdtempSync(path.join(os.tmpdir(), 'vineward-profile-'));
  const use = testInfo.project.use;
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    args: use.launchOptions?.args ?? [],
    baseURL: use.baseURL,
    viewport: use.viewport,
    isMobile: use.isMobile,
    hasTouch: use.hasTouch,
  });
  try {
    expect(browserName).toBe('chromium');
    const page = context.pages()[0] ?? (await context.newPage());
    await signInAs(page, 'scout@example.com');
    await page.goto('/field');
    await waitForServiceWorker(page);
    const cdp = await context.newCDPSession(page);
    const { installabilityErrors } = await cdp.send('Page.getInstallabilityErrors');
    expect(installabilityErrors).toEqual([]);
    const manifest = await (await page.request.get('/manifest.webmanifest')).json();
    expect(manifest).toMatchObject({ name: 'Vineward', display: 'standalone', start_url: '/field', theme_color: '#244a2a' });
    for (const icon of manifest.icons as { src: string; sizes: string }[]) {
      const res = await page.request.get(icon.src);
      expect(res.status(), icon.src).toBe(200);
    }
  } finally {
    await context.close();
    rmSync(profile, { recursive: true, force: true });
  }
});

test('a page never opened before shows the offline page instead of a browser error', async ({ page, context }) => {
  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  await context.setOffline(true);
  await page.goto('/field/blocks/00000000-0000-4000-8000-000000000000');
  await expect(page.getByRole('heading', { name: /No signal, and this page was not opened before/ })).toBeVisible();
  await context.setOffline(false);
});
