import { expect, test } from '@playwright/test';
import { closeTestDb, testDb } from '../helpers/fixtures';
import { signInAs } from './helpers/session';

const DEMO = 'Ninefold Ridge Estate';

test.afterEach(async () => {
  // Other tests read the demo estate's reports by calendar year.
  await testDb()('organisations').where({ name: DEMO }).update({ season_start_month: 1 });
});
test.afterAll(closeTestDb);

test('a manager starts the estate’s seasons in July, and the report names the months it covers', async ({ page }) => {
  await signInAs(page, 'manager@example.com');
  await page.goto('/settings');
  await page.getByLabel('Seasons start in').selectOption({ label: 'July' });
  await page.getByRole('button', { name: 'Save season start' }).click();
  await expect(page.getByText(/Seasons now start in July: season \d{4} runs from \d{4}-07-01 up to \d{4}-07-01\./)).toBeVisible();
  expect((await testDb()('organisations').where({ name: DEMO }).first('season_start_month')).season_start_month).toBe(7);

  await page.goto('/reports');
  await page.getByRole('link', { name: 'Creek Flat' }).click();
  await expect(page.getByTestId('season-span')).toHaveText(/^From \d{4}-07-01 up to \d{4}-07-01$/);
  // The season picker names a two-year season by both years.
  await expect(page.getByTestId('report-toolbar').getByLabel('Season').locator('option:checked')).toHaveText(/^\d{4}–\d{2}$/);
});

test('a scout reads when seasons start but cannot change it', async ({ page }) => {
  await signInAs(page, 'scout@example.com');
  await page.goto('/settings');
  await expect(page.getByText('Seasons start in January. A manager can change this.')).toBeVisible();
  await expect(page.getByRole('button', { name: 'Save season start' })).toHaveCount(0);
});
