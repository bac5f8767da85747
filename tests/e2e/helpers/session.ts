import { expect, type Page } from '@playwright/test';

export async function signInAs(page: Page, email: string, password = 'vineward-demo') {
  await page.goto('/signin');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).not.toHaveURL(/\/signin/);
}

/** Waits until the service worker controls the page, so that the next reload can come from it. */
export async function waitForServiceWorker(page: Page) {
  await page.waitForFunction(async () => {
    await navigator.serviceWorker.ready;
    return !!navigator.serviceWorker.controller;
  });
}

/** What the field status bar says waits on the phone; null until it has read the outbox. */
export async function waitingOnPhone(page: Page) {
  const bar = page.getByTestId('sync-status');
  const count = (value: string | null) => (value === null ? null : Number(value));
  return { records: count(await bar.getAttribute('data-waiting')), photos: count(await bar.getAttribute('data-photos-waiting')) };
}
