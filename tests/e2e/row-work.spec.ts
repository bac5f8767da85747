import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { closeTestDb, testDb } from '../helpers/fixtures';
import { signInAs, waitForServiceWorker, waitingOnPhone } from './helpers/session';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const CREEK_FLAT = '0b10c4a0-0000-4000-8000-000000000002';
const PRUNER_ID = '8a6b2c10-1d4e-4f3a-8b7c-000000000003';
const WCAG = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

test.afterAll(closeTestDb);

async function expectAccessible(page: Page) {
  const result = await new AxeBuilder({ page }).withTags(WCAG).analyze();
  expect(result.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)).toEqual([]);
}

async function expectNoSideScroll(page: Page) {
  expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
}

test('a crew lead marks two rows done with no signal, reloads, and they arrive once', async ({ page, context }) => {
  test.setTimeout(180_000);
  await page.setViewportSize({ width: 360, height: 740 });
  const started = new Date();
  // Demo: Upper Terrace is pruned up to row 20 (part of it); rows 22 and 23 are not started.
  await testDb()('row_work').where({ block_id: UPPER_TERRACE, pass: 'pruning' }).whereIn('row_number', [22, 23]).delete();
  await signInAs(page, 'pruner@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  await page.goto(`/field/blocks/${UPPER_TERRACE}`);
  const panel = page.getByTestId('row-work-panel');
  await expect(panel.getByRole('button', { name: 'Row 1: done' })).toBeVisible();
  await expectAccessible(page);
  await expectNoSideScroll(page);
  // Open the walk once online too, so the phone keeps the page.
  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=23&position=60`);
  await expect(page.getByTestId('row-end')).toBeVisible();

  await context.setOffline(true);
  await page.goto(`/field/blocks/${UPPER_TERRACE}`);
  await panel.getByRole('button', { name: 'Pruning', exact: true }).click();
  await panel.getByRole('button', { name: 'Mark row 22 done' }).click();
  const form = page.getByRole('form', { name: 'Row 22 done' });
  await form.getByRole('button', { name: 'One person more' }).click();
  await form.getByRole('button', { name: 'One person more' }).click();
  await form.getByLabel('Started').fill('07:00');
  await form.getByLabel('Finished').fill('09:30');
  // 3 people × 2.5 h, filled in.
  await expect(form.getByLabel('Person-hours')).toHaveValue('7.5');
  await expectAccessible(page);
  await form.getByRole('button', { name: /Row done$/ }).click();
  await expect(panel.getByRole('button', { name: 'Row 22: done, waiting to be sent' })).toBeVisible();

  // The second row from the end of the row in the stepper: the crew's pass and size come back, and the last finish is this start.
  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=23&position=60`);
  await page
    .getByTestId('row-end')
    .getByRole('button', { name: /Row done$/ })
    .click();
  const second = page.getByRole('form', { name: 'Row 23 done' });
  await expect(second.getByRole('button', { name: 'Pruning', exact: true })).toHaveAttribute('aria-pressed', 'true');
  await expect(second.getByLabel('Crew size')).toHaveValue('3');
  await expect(second.getByLabel('Started')).toHaveValue('09:30');
  await second.getByLabel('Finished').fill('11:00');
  await expect(second.getByLabel('Person-hours')).toHaveValue('4.5');
  await second.getByRole('button', { name: /Row done$/ }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Row 23 saved as done' })).toBeVisible();
  await expect.poll(() => waitingOnPhone(page)).toEqual({ records: 2, photos: 0 });

  await page.reload();
  await expect.poll(() => waitingOnPhone(page)).toEqual({ records: 2, photos: 0 });
  await expect(page.getByTestId('row-end').getByText('Row 23 is done in Pruning')).toBeVisible();

  await context.setOffline(false);
  await page.getByRole('button', { name: 'Sync now' }).click();
  await expect.poll(() => waitingOnPhone(page), { timeout: 60_000 }).toEqual({ records: 0, photos: 0 });
  // Once each, whatever the retries.
  await page.getByRole('button', { name: 'Sync now' }).click();
  const stored = await testDb()('row_work')
    .where({ block_id: UPPER_TERRACE, pass: 'pruning', recorded_by: PRUNER_ID })
    .whereIn('row_number', [22, 23])
    .where('received_at', '>=', started)
    .orderBy('row_number');
  expect(stored.map((r) => [r.row_number, r.crew_size, Number(r.person_hours), r.from_position])).toEqual([
    [22, 3, 7.5, null],
    [23, 3, 4.5, null],
  ]);
  await page.goto(`/field/blocks/${UPPER_TERRACE}`);
  await expect(panel.getByRole('button', { name: 'Row 23: done' })).toBeVisible();
});

test('the manager sees every block, the strip per pass and the projected finish of the block behind', async ({ page }) => {
  await signInAs(page, 'manager@example.com');
  await page.goto('/work');
  const creek = page.getByTestId('estate-row').filter({ hasText: 'Creek Flat' });
  await expect(creek).toContainText('behind');
  expect(await page.getByTestId('estate-row').count()).toBeGreaterThanOrEqual(4);
  await expectAccessible(page);
  await creek.getByRole('link', { name: 'Creek Flat' }).click();
  await expect(page).toHaveURL(new RegExp(`/work/${CREEK_FLAT}`));
  await expect(page.getByRole('heading', { name: 'Creek Flat' })).toBeVisible();
  // Demo: rows 1–21 pruned end to end, row 22 to vine 90.
  await expect(page.getByRole('img', { name: 'Pruning: 21 rows done, 1 partly done, 128 not started' })).toBeVisible();
  await expect(page.getByTestId('finish-pruning')).toHaveText(/^\d{1,2} [A-Z][a-z]{2} \d{4}$/);
  await expect(page.getByTestId('behind-pruning')).toBeVisible();
  await expect(page.getByText(/local law/).first()).toBeVisible();
  await expectAccessible(page);
  await page.setViewportSize({ width: 360, height: 740 });
  await expectNoSideScroll(page);
  await expect(page.getByRole('img', { name: /^Pruning:/ })).toBeVisible();
  await page.setViewportSize({ width: 1280, height: 900 });
  await expectNoSideScroll(page);
  await page.goto('/work');
  await expectNoSideScroll(page);
  await page.setViewportSize({ width: 360, height: 740 });
  // The table scrolls inside its own box; the page does not.
  await expectNoSideScroll(page);
});
