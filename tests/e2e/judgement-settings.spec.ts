import { expect, test } from '@playwright/test';
import { closeTestDb, makeBlock, testDb } from '../helpers/fixtures';
import { signInAs, waitForServiceWorker } from './helpers/session';

const DEMO_ORG = 'Ninefold Ridge Estate';
let block: { id: string; name: string };

test.beforeAll(async () => {
  const org = await testDb()('organisations').where({ name: DEMO_ORG }).first('id');
  // A block of its own, so no other test's demo block reads a changed setting.
  block = await makeBlock(org.id, { rows: 1, vinesPerRow: 3, name: `Settings Test ${Date.now() % 100000}` });
});
test.afterAll(async () => {
  await testDb()('blocks').where({ id: block.id }).delete();
  await closeTestDb();
});

test("a manager sets a block's shade-cane internode, and a scout's phone judges with it offline", async ({ page, browser }) => {
  test.setTimeout(180_000);
  await signInAs(page, 'manager@example.com');
  await page.goto('/settings');
  await page.getByTestId('settings-level').selectOption({ label: `Block: ${block.name}` });
  await expect(page.getByText(`A value typed here is ${block.name}'s own`)).toBeVisible();
  const setting = page.getByTestId('setting-canes.shadeInternodeAboveMm');
  // The default and its source sit beside the field.
  await expect(setting).toContainText('Default 152.4 mm');
  await expect(setting).toContainText('eXtension');
  // 5 in (127 mm), the low end of eXtension's "5-6 inches or more".
  await setting.getByRole('spinbutton').fill('127');
  await page.getByTestId('save-settings').click();
  await expect(page.getByText(`Saved. ${block.name}'s judgements now use these settings.`)).toBeVisible();
  await expect(setting).toContainText('In use: 127 mm (block)');

  // A bad value is refused next to its field, and nothing changes.
  await page.getByTestId('setting-canes.thinBelowMm').getByRole('spinbutton').fill('13');
  await page.getByTestId('save-settings').click();
  await expect(page.getByTestId('setting-canes.thinBelowMm').getByRole('alert')).toContainText('thinBelowMm');
  expect((await testDb()('block_settings').where({ block_id: block.id }).first()).overrides).toEqual({ canes: { shadeInternodeAboveMm: 127 } });

  const phone = await browser.newContext();
  const scout = await phone.newPage();
  await signInAs(scout, 'scout@example.com');
  await scout.goto('/field');
  await waitForServiceWorker(scout);
  await scout.goto(`/field/blocks/${block.id}`);
  await expect(scout.getByRole('heading', { name: block.name })).toBeVisible();
  await scout.goto(`/field/blocks/${block.id}/walk?row=1&position=1`);
  await expect(scout.getByTestId('vine-address')).toContainText('Row 1 · Vine 1');

  await phone.setOffline(true);
  await scout.reload();
  await expect(scout.getByTestId('connection')).toHaveText('Offline');
  await scout.getByRole('button', { name: 'Cane diameter' }).click();
  await scout.getByLabel('Base diameter (mm)').fill('9.5');
  await scout.getByLabel('Longest internode (mm)').fill('140');
  // 140 mm is an ordinary cane by the default (6 in) and a shade cane by the block's 127 mm.
  const feedback = scout.getByTestId('cane-feedback');
  await expect(feedback).toContainText('Use only if nothing better');
  await expect(feedback).toContainText('Shade cane: long internodes');
  await scout.getByLabel('Longest internode (mm)').fill('120');
  await expect(feedback).toContainText('Good fruit cane');
  await phone.close();
});

test("the sampling plan's yield suggestion uses the block's own vine-to-vine spread", async ({ page }) => {
  const org = await testDb()('organisations').where({ name: DEMO_ORG }).first('id');
  const wide = await makeBlock(org.id, { rows: 10, vinesPerRow: 50, name: `Plan Spread ${Date.now() % 100000}` });
  try {
    await signInAs(page, 'manager@example.com');
    const saved = await page.request.put(`/api/blocks/${wide.id}/settings`, { data: { overrides: { crop: { yieldCvPercent: 15 } } } });
    expect(saved.status()).toBe(200);
    await page.goto('/plans');
    await page.getByLabel('Block').selectOption({ label: `${wide.name} (500 vines)` });
    // n0 = (z × CV / E)² (Wolpert & Vilas, AJEV Technical Brief, 1992) = (1.96 × 15 / 10)² = 8.64; the finite population
    // correction n = n0 / (1 + (n0 − 1) / N) (Cochran, Sampling Techniques, 3rd ed., 1977, ch. 4; chapter from memory)
    // gives 8.64 / (1 + 7.64 / 500) = 8.51 → 9 vines. The default 30% spread would give 33.
    await expect(page.getByRole('button', { name: /^9 to estimate the mean yield a vine within ±10% \(vine yields varying by 15%\)/ })).toBeVisible();
    await expect(page.getByText("(spread from the block's setting)")).toBeVisible();

    // Eight vines weighed one by one: their own spread, 2.138 / 5 = 42.8%, replaces the setting.
    // (1.96 × 42.8 / 10)² = 70.4; 70.4 / (1 + 69.4 / 500) = 61.8 → 62 vines.
    for (const [i, kg] of [2, 4, 4, 4, 5, 5, 7, 9].entries()) {
      const res = await page.request.post('/api/measurements', {
        data: { blockId: wide.id, kind: 'yield', row: 1, position: i + 1, weight: kg, weightUnit: 'kg', clusters: null, measuredOn: '2026-09-18' },
      });
      expect(res.status()).toBe(201);
    }
    await page.reload();
    await page.getByLabel('Block').selectOption({ label: `${wide.name} (500 vines)` });
    await expect(page.getByRole('button', { name: /^62 to estimate the mean yield a vine within ±10% \(vine yields varying by 42.8%\)/ })).toBeVisible();
    await expect(page.getByText(/\(spread from 8 single-vine yields of 20\d\d\)/)).toBeVisible();
  } finally {
    await testDb()('measurements').where({ block_id: wide.id }).delete();
    await testDb()('blocks').where({ id: wide.id }).delete();
  }
});
