import { expect, test } from '@playwright/test';
import { closeTestDb, testDb } from '../helpers/fixtures';
import { signInAs } from './helpers/session';

const NORTH_BENCH = '0b10c4a0-0000-4000-8000-000000000004';
const PRUNER_ID = '8a6b2c10-1d4e-4f3a-8b7c-000000000003';

test.afterAll(closeTestDb);

test('a scout opening a block inside its re-entry interval sees a clear warning with the time it ends', async ({ page }) => {
  const [spray] = await testDb()('sprays')
    .insert({
      organisation_id: '5d1f0a3e-7c2b-4e8a-9b61-0a0d2c9e4f01',
      block_id: NORTH_BENCH,
      product: 'Example Sulfur 80 WP',
      applied_at: new Date(Date.now() - 3600 * 1000),
      rei_hours: 24,
    })
    .returning('id');
  try {
    await signInAs(page, 'scout@example.com');
    await page.goto(`/field/blocks/${NORTH_BENCH}`);
    const warning = page.getByTestId('rei-warning');
    await expect(warning).toContainText('Restricted-entry interval in force');
    await expect(warning).toContainText('Example Sulfur 80 WP');
    await expect(warning).toContainText('unless the label allows it');
    await page.goto(`/field/blocks/${NORTH_BENCH}/walk?row=2&position=4`);
    await expect(page.getByTestId('rei-warning')).toBeVisible();
  } finally {
    await testDb()('sprays').where({ id: spray.id }).delete();
  }
});

test('a pruner switches the field screens to Spanish, and the choice follows the account', async ({ page, browser }) => {
  try {
    await signInAs(page, 'pruner@example.com');
    await page.goto('/field');
    await page.getByRole('button', { name: 'Español' }).click();
    await expect(page.getByRole('heading', { name: 'Campo' })).toBeVisible();
    await page.goto(`/field/blocks/${NORTH_BENCH}/walk?row=3&position=2`);
    await expect(page.getByTestId('vine-address')).toContainText('Hilera 3 · Planta 2');
    await expect(page.getByRole('button', { name: 'Brotación débil' })).toBeVisible();
    await expect(page.getByRole('button', { name: 'Planta siguiente ▶' })).toBeVisible();

    // Another phone: no cookie yet, the account's language is applied.
    const other = await browser.newContext({ viewport: { width: 360, height: 740 } });
    const second = await other.newPage();
    await signInAs(second, 'pruner@example.com');
    await second.goto('/field');
    await expect(second.getByRole('heading', { name: 'Campo' })).toBeVisible();
    await other.close();
  } finally {
    await testDb()('users').where({ id: PRUNER_ID }).update({ locale: 'en' });
  }
});

test('the cane form gives the verdict and bud range as the numbers are typed', async ({ page }) => {
  await signInAs(page, 'scout@example.com');
  await page.goto(`/field/blocks/${NORTH_BENCH}/walk?row=5&position=10`);
  await page.getByRole('button', { name: 'Cane diameter' }).click();
  await page.getByLabel('Base diameter (mm)').fill('9.5');
  await page.getByRole('group', { name: 'Exposure' }).getByRole('button', { name: 'Sun' }).click();
  const feedback = page.getByTestId('cane-feedback');
  await expect(feedback).toContainText('Good fruit cane');
  await expect(feedback).toContainText(/Keep 12–14 buds/);
  await page.getByLabel('Longest internode (mm)').fill('160');
  await expect(feedback).toContainText('Shade cane: long internodes');
  await page.getByLabel('Base diameter (mm)').fill('15');
  await expect(feedback).toContainText('Bull cane');
});
