import { randomUUID } from 'node:crypto';
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { closeTestDb, testDb } from '../helpers/fixtures';
import { signInAs } from './helpers/session';

const DEMO_ORG = '5d1f0a3e-7c2b-4e8a-9b61-0a0d2c9e4f01';
const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
const HOUR = 3600_000;
const tag = randomUUID().slice(0, 6);
const made: { table: string; id: string }[] = [];

async function put(table: string, row: Record<string, unknown>) {
  const id = (row.id as string | undefined) ?? randomUUID();
  await testDb()(table).insert({ id, ...row });
  made.push({ table, id });
  return id;
}

// What this file adds to the demo estate goes again, so no other spec meets a spray in force.
test.afterAll(async () => {
  for (const { table, id } of made.reverse()) await testDb()(table).where({ id }).del();
  await closeTestDb();
});

async function slot(row: number, position: number) {
  return (await testDb()('vine_positions').where({ block_id: UPPER_TERRACE, row_number: row, position }).first('id')).id as string;
}

async function axeViolations(page: Page) {
  const result = await new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
  return result.violations.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`);
}

test('a manager sees the morning page’s items and follows an overdue task to its page', async ({ page }) => {
  const dueOn = new Date(Date.now() - 3 * 24 * HOUR).toISOString().slice(0, 10);
  const taskId = await put('tasks', { organisation_id: DEMO_ORG, block_id: UPPER_TERRACE, title: `Renew trunks ${tag}`, due_on: dueOn, status: 'open' });
  await put('flags', {
    organisation_id: DEMO_ORG,
    block_id: UPPER_TERRACE,
    position_id: await slot(7, 3),
    row_number: 7,
    position: 3,
    to_position: 5,
    reason: 'trunk-renewal',
    flagged_at: new Date(Date.now() - 24 * HOUR).toISOString(),
    payload_sha256: 'e2e',
  });
  await put('sprays', {
    organisation_id: DEMO_ORG,
    block_id: UPPER_TERRACE,
    product: `Test copper ${tag}`,
    applied_at: new Date(Date.now() - HOUR).toISOString(),
    rei_hours: 24,
  });
  await put('observations', {
    organisation_id: DEMO_ORG,
    block_id: UPPER_TERRACE,
    position_id: await slot(9, 4),
    row_number: 9,
    position: 4,
    kind: 'trunk-injury',
    data: { cause: 'mechanical', severity: 'severe', girdlingPercent: 70 },
    observed_at: new Date().toISOString(),
    severity: 3,
    payload_sha256: 'e2e',
  });

  await signInAs(page, 'manager@example.com');
  await page.goto('/desk');
  await expect(page.getByRole('heading', { name: 'Desk', level: 1 })).toBeVisible();
  for (const heading of [
    'Blocks under a re-entry interval now',
    'New findings',
    'Flags not yet in a task',
    'Overdue tasks',
    'Mail that may not have arrived',
    'Team',
  ]) {
    await expect(page.getByRole('heading', { name: heading })).toBeVisible();
  }
  await expect(page.getByRole('heading', { name: /Scouting coverage, season/ })).toBeVisible();
  await expect(page.getByTestId('desk-spray').filter({ hasText: `Test copper ${tag}` })).toBeVisible();
  await expect(
    page
      .getByTestId('desk-findings')
      .getByRole('link', { name: /Row 9, .*Trunk injury/ })
      .first(),
  ).toBeVisible();
  await expect(page.getByTestId('desk-flag-block').filter({ hasText: 'Trunk renewal' }).first()).toBeVisible();
  await expect(page.getByTestId('desk-coverage').first()).toContainText('standing vines');

  // The page fits a phone: nothing scrolls sideways.
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(360);

  await page.getByRole('link', { name: `Renew trunks ${tag}` }).click();
  await expect(page).toHaveURL(new RegExp(`/tasks/${taskId}$`));
  await expect(page.getByRole('heading', { name: `Renew trunks ${tag}` })).toBeVisible();

  // And a finding to its vine on the grid.
  await page.goto('/desk');
  await page
    .getByTestId('desk-findings')
    .getByRole('link', { name: /Row 9, .*Trunk injury/ })
    .first()
    .click();
  await expect(page).toHaveURL(new RegExp(`/grid/${UPPER_TERRACE}\\?row=9&position=4$`));

  // And the flags not in a task to the flags list, filtered to that block.
  await page.goto('/desk');
  await page.getByTestId('desk-flag-block').filter({ hasText: 'Upper Terrace' }).getByRole('link').click();
  await expect(page).toHaveURL(new RegExp(`/flags\\?block=${UPPER_TERRACE}&untasked=1$`));
  await expect(page.getByLabel('Not in a task yet')).toBeChecked();
  await expect(page.getByLabel('Block')).toHaveValue(UPPER_TERRACE);
});

for (const role of ['manager', 'advisor', 'scout', 'pruner'] as const) {
  test(`the ${role}’s Desk has no WCAG 2.2 AA violations, on a phone and at 1280 wide`, async ({ page }) => {
    await signInAs(page, `${role}@example.com`);
    await page.goto('/desk');
    await expect(page.getByRole('heading', { name: 'Desk', level: 1 })).toBeVisible();
    expect(await axeViolations(page)).toEqual([]);
    await page.setViewportSize({ width: 1280, height: 900 });
    expect(await axeViolations(page)).toEqual([]);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1280);
  });
}

test('an advisor’s Desk lists the organisations they advise and opens another one', async ({ page }) => {
  await signInAs(page, 'advisor@example.com');
  await page.goto('/desk');
  const orgs = page.getByTestId('desk-organisation');
  await expect(orgs).toHaveCount(2);
  // One is the organisation open now; the other opens with its button.
  await expect(orgs.getByRole('link', { name: 'See them below' })).toHaveCount(1);
  const elsewhere = orgs.filter({ has: page.getByRole('button', { name: /^Open / }) });
  const name = (await elsewhere.getByTestId('desk-organisation-name').textContent())!;
  expect(['Ninefold Ridge Estate', 'Hollowmere Growers']).toContain(name);
  await elsewhere.getByRole('button', { name: `Open ${name}` }).click();
  await expect(orgs.filter({ hasText: name }).getByRole('link', { name: 'See them below' })).toBeVisible();
  await expect(page.getByText(name, { exact: true }).first()).toBeVisible();
});
