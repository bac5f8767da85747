import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Locator, type Page } from '@playwright/test';
import { testPhoto } from './helpers/photos';
import { signInAs, waitForServiceWorker } from './helpers/session';

// The field on a 360 × 740 phone (playwright.config.ts): the header, the field places, and forms
// that keep the field being filled in view of the person filling it.
const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const NORTH_BENCH = '0b10c4a0-0000-4000-8000-000000000004';
const WCAG = ['wcag2a', 'wcag2aa', 'wcag21aa', 'wcag22aa'];
const FIELDS = 'input:not([type="file"]), textarea, select, button[aria-pressed]';
const PHONE = { width: 360, height: 740 };
// About what an on-screen keyboard leaves of a 740 px phone.
const WITH_KEYBOARD = { width: 360, height: 420 };

async function expectAccessible(page: Page) {
  const result = await new AxeBuilder({ page }).withTags(WCAG).analyze();
  expect(result.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)).toEqual([]);
}

/** True when the element itself is what a finger at its centre would touch. */
function isHitAtCentre(field: Locator) {
  return field.evaluate((el) => {
    const r = el.getBoundingClientRect();
    const hit = document.elementFromPoint(r.left + r.width / 2, r.top + r.height / 2);
    return !!hit && (hit === el || el.contains(hit));
  });
}

/** The element sits wholly between the bars at the top and the bottom of the screen. */
function isClearOfBars(target: Locator) {
  return target.evaluate((el) => {
    const r = el.getBoundingClientRect();
    let top = 0;
    let bottom = window.visualViewport?.height ?? window.innerHeight;
    for (const bar of document.querySelectorAll('[data-sticky-top]')) {
      const b = bar.getBoundingClientRect();
      if (b.height > 0 && b.top <= 1) top = Math.max(top, b.bottom);
    }
    for (const bar of document.querySelectorAll('[data-sticky-bottom]')) {
      const b = bar.getBoundingClientRect();
      if (b.height > 0 && !bar.contains(el) && b.top < bottom) bottom = Math.min(bottom, b.top);
    }
    return r.top >= top - 0.5 && r.bottom <= bottom + 0.5;
  });
}

async function expectFirstFieldUncovered(form: Locator) {
  const first = form.locator(FIELDS).first();
  await expect(first).toBeVisible();
  await expect.poll(() => isHitAtCentre(first), { timeout: 3_000 }).toBe(true);
  await expect.poll(() => isClearOfBars(first), { timeout: 3_000 }).toBe(true);
}

/** With the keyboard up (the viewport shrunk), the focused field is still clear of the action bar. */
async function expectFocusedClearWithKeyboard(page: Page, field: Locator) {
  await field.focus();
  await page.setViewportSize(WITH_KEYBOARD);
  await expect(field).toBeFocused();
  await expect.poll(() => isClearOfBars(field), { timeout: 3_000 }).toBe(true);
  await expect.poll(() => isHitAtCentre(field), { timeout: 3_000 }).toBe(true);
  await page.setViewportSize(PHONE);
}

interface Reading {
  /** Fields filled first, by label. */
  before: [string, string][];
  /** The field the verdict reads, typed into last. */
  field: string;
  value: string;
  feedback: string;
}

const KINDS: { name: string; reading?: Reading }[] = [
  { name: 'Cane diameter', reading: { before: [], field: 'Base diameter (mm)', value: '9', feedback: 'cane-feedback' } },
  { name: 'Shade cane', reading: { before: [], field: 'Base diameter (mm)', value: '6', feedback: 'cane-feedback' } },
  { name: 'Weak budbreak', reading: { before: [['Buds retained', '20']], field: 'Buds pushed', value: '8', feedback: 'budbreak-feedback' } },
  { name: 'Trunk injury' },
  { name: 'Cane or shoot injury' },
  { name: 'Missing or dead vine' },
  {
    name: 'Winter bud injury',
    reading: { before: [['Buds cut', '50']], field: 'Dead primary buds', value: '12', feedback: 'bud-injury-feedback' },
  },
  { name: 'Pruning record' },
  {
    name: 'Pruning check',
    reading: {
      before: [
        ['Canes kept', '2'],
        ['Buds left on the canes or spurs', '20'],
        ['Renewal spurs', '2'],
      ],
      field: 'Block target, buds per vine (optional)',
      value: '24',
      feedback: 'check-feedback',
    },
  },
  { name: 'Note' },
];

test('every observation form opens with its first field uncovered, keeps its verdict beside the field, and its bar off the focused field', async ({ page }) => {
  test.setTimeout(240_000);
  // The manager may record every kind, pruning checks included.
  await signInAs(page, 'manager@example.com');
  await page.goto(`/field/blocks/${NORTH_BENCH}/walk?row=5&position=10`);
  await expect(page.getByTestId('vine-address')).toContainText('Row 5');
  for (const kind of KINDS) {
    await test.step(kind.name, async () => {
      await page.getByRole('button', { name: kind.name, exact: true }).click();
      const form = page.getByRole('form', { name: kind.name });
      await expectFirstFieldUncovered(form);
      if (kind.reading) {
        for (const [label, value] of kind.reading.before) await form.getByLabel(label, { exact: true }).fill(value);
        const field = form.getByLabel(kind.reading.field, { exact: true });
        await field.focus();
        await field.pressSequentially(kind.reading.value);
        await expect(field).toBeFocused();
        const feedback = form.getByTestId(kind.reading.feedback);
        await expect(feedback).toBeInViewport({ ratio: 1 });
        await expect.poll(() => isClearOfBars(feedback)).toBe(true);
        await expect.poll(() => isClearOfBars(field)).toBe(true);
        await expectFocusedClearWithKeyboard(page, field);
      }
      // The note is the field nearest the bar: the hardest one to keep clear of it.
      await expectFocusedClearWithKeyboard(page, form.getByLabel('Note (optional)', { exact: true }));
      await form.getByRole('button', { name: 'Cancel' }).click();
      await expect(form).toHaveCount(0);
    });
  }
});

test('a bud target far over the row it fills is questioned beside the field, one within it is not', async ({ page }) => {
  // Ohio State, "2023 Grape Pruning Primer": "approximately 4-6 buds per foot of vine spacing".
  // North Bench plants a vine every 1.4 m (4.59 ft): 18–28 buds a vine; 80 is 17.4 a foot.
  await signInAs(page, 'manager@example.com');
  await page.goto(`/field/blocks/${NORTH_BENCH}/walk?row=5&position=10`);
  await page.getByRole('button', { name: 'Pruning record', exact: true }).click();
  const form = page.getByRole('form', { name: 'Pruning record' });
  const target = form.getByLabel('Bud target (optional)', { exact: true });
  await target.fill('80');
  await expect(form.getByTestId('bud-load-note')).toHaveText(
    '80 buds a vine is 17.4 a foot of row (57.1 a metre): more than the 4–6 a foot (18–28 a vine) published for this spacing. Check the target.',
  );
  await expect(form.getByTestId('bud-load-note')).toBeInViewport({ ratio: 1 });
  await expectAccessible(page);
  await target.fill('24');
  await expect(form.getByTestId('bud-load-note')).toHaveCount(0);
  await target.fill('10');
  await expect(form.getByTestId('bud-load-note')).toContainText('fewer than the 4–6 a foot (18–28 a vine)');
});

test('the flag form and both row work forms open with their first field uncovered and keep the focused field clear', async ({ page }) => {
  test.setTimeout(180_000);
  await signInAs(page, 'pruner@example.com');

  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=23&position=60`);
  await page.getByRole('button', { name: /Flag for extra care/ }).click();
  const flag = page.getByRole('form', { name: 'Flag for extra care' });
  await expectFirstFieldUncovered(flag);
  await expectFocusedClearWithKeyboard(page, flag.getByLabel('Note', { exact: true }));
  await flag.getByRole('button', { name: 'Cancel' }).click();

  // The end of the row: "Row done".
  await expect(page.getByTestId('row-end')).toBeVisible();
  await page
    .getByTestId('row-end')
    .getByRole('button', { name: /Row done/ })
    .click();
  const rowEnd = page.getByRole('form', { name: 'Row 23 done' });
  await expectFirstFieldUncovered(rowEnd);
  await expectFocusedClearWithKeyboard(page, rowEnd.getByLabel('Person-hours'));
  await expectFocusedClearWithKeyboard(page, rowEnd.getByLabel('Note (optional)', { exact: true }));
  await rowEnd.getByRole('button', { name: 'Cancel' }).click();

  // The block's row list.
  await page.goto(`/field/blocks/${UPPER_TERRACE}`);
  await page.getByTestId('row-work-panel').getByRole('button', { name: 'Mark row 23 done' }).click();
  const fromList = page.getByRole('form', { name: 'Row 23 done' });
  await expectFirstFieldUncovered(fromList);
  await expectFocusedClearWithKeyboard(page, fromList.getByLabel('Note (optional)', { exact: true }));
});

test('a scout has a one-line header and the field places at the bottom, and the field pages pass axe', async ({ page }) => {
  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  const header = page.locator('body > div header').first();
  expect((await header.boundingBox())!.height).toBeLessThanOrEqual(64);
  const places = page.getByRole('navigation', { name: 'Field places' });
  await expect(places).toBeVisible();
  await expect(places.getByRole('link', { name: 'Field' })).toHaveAttribute('aria-current', 'page');
  await expect(places.getByRole('link', { name: 'Waiting on this phone' })).toBeVisible();
  // The desk menu is not spread across the header on a phone.
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeHidden();
  await expect(page.getByTestId('sync-status')).toBeVisible();
  expect((await page.getByTestId('sync-status').boundingBox())!.height).toBeLessThanOrEqual(64);
  await expect(page.getByRole('link', { name: /Upper Terrace/ })).toBeVisible();
  await expectAccessible(page);

  await places.getByRole('link', { name: 'Waiting on this phone' }).click();
  await expect(page).toHaveURL(/\/field\/outbox$/);
  await expect(page.getByRole('navigation', { name: 'Field places' }).getByRole('link', { name: 'Waiting on this phone' })).toHaveAttribute(
    'aria-current',
    'page',
  );
  await expectAccessible(page);

  await page.goto(`/field/blocks/${NORTH_BENCH}`);
  await expectAccessible(page);
  await page.goto(`/field/blocks/${NORTH_BENCH}/walk?row=5&position=10`);
  await expect(page.getByTestId('vine-address')).toContainText('Row 5');
  // Previous and next sit above the field places, not under them.
  const next = page.getByRole('button', { name: /Next vine/ });
  await expect.poll(() => isHitAtCentre(next)).toBe(true);
  await expectAccessible(page);
  await page.getByRole('button', { name: 'Cane diameter', exact: true }).click();
  await expect(page.getByRole('form', { name: 'Cane diameter' })).toBeVisible();
  await expectAccessible(page);
});

test('a pruner has My tasks among the field places', async ({ page }) => {
  await signInAs(page, 'pruner@example.com');
  await page.goto('/field');
  const places = page.getByRole('navigation', { name: 'Field places' });
  await places.getByRole('link', { name: 'My tasks' }).click();
  await expect(page).toHaveURL(/\/field\/tasks$/);
  await expect(page.getByRole('heading', { name: 'My tasks' })).toBeVisible();
  await expectAccessible(page);
});

test('a manager on a phone finds the desk pages behind the menu; at 1280 px the header is as before', async ({ page }) => {
  await signInAs(page, 'manager@example.com');
  await page.goto('/field');
  await expect(page.getByRole('navigation', { name: 'Field places' })).toHaveCount(0);
  const header = page.locator('body > div header').first();
  expect((await header.boundingBox())!.height).toBeLessThanOrEqual(64);
  await expect(page.getByRole('link', { name: 'Team', exact: true })).toBeHidden();
  await page.getByText('Menu', { exact: true }).click();
  const menu = page.getByRole('navigation', { name: 'Pages' });
  await expect(menu.getByRole('link', { name: 'Team', exact: true })).toBeVisible();
  await expectAccessible(page);
  await menu.getByRole('link', { name: 'Blocks', exact: true }).click();
  await expect(page).toHaveURL(/\/blocks$/);
  // The menu closes once a page is chosen.
  await expect(page.getByRole('navigation', { name: 'Pages' })).toBeHidden();

  await page.setViewportSize({ width: 1280, height: 800 });
  await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Team', exact: true })).toBeVisible();
  await expect(page.getByTestId('phone-menu')).toBeHidden();
});

test('with a record and a photo waiting offline, "Sync now" stays on a 360 px screen where a finger can press it', async ({ page, context }) => {
  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=14&position=2`);
  await expect(page.getByTestId('vine-address')).toContainText('Row 14 · Vine 2');
  await context.setOffline(true);
  try {
    await page.getByRole('button', { name: 'Weak budbreak' }).click();
    await page.getByLabel('Buds retained').fill('20');
    await page.getByLabel('Buds pushed').fill('8');
    await page.getByTestId('photo-input').setInputFiles(await testPhoto('narrow'));
    await expect(page.getByTestId('photo-count')).toHaveText('1 photo');
    await page.getByRole('button', { name: 'Save and next vine' }).click();
    await expect(page.getByRole('status').filter({ hasText: 'Saved on this phone' })).toBeVisible();
    const bar = page.getByTestId('sync-status');
    await expect(bar).toHaveAttribute('data-photos-waiting', '1');
    const syncNow = bar.getByRole('button', { name: 'Sync now' });
    const box = (await syncNow.boundingBox())!;
    expect(box.x).toBeGreaterThanOrEqual(0);
    expect(box.x + box.width).toBeLessThanOrEqual(PHONE.width);
    await expect.poll(() => isHitAtCentre(syncNow)).toBe(true);
  } finally {
    await context.setOffline(false);
  }
});

test('"Save and next vine" pressed while a photo is still being prepared waits for it: the photo stays with its own vine', async ({ page, context }) => {
  // A slow phone: each photo takes a second and a half to decode before it is downscaled.
  await page.addInitScript(() => {
    const decode = window.createImageBitmap.bind(window);
    window.createImageBitmap = ((...args: Parameters<typeof createImageBitmap>) =>
      new Promise((resolve) => setTimeout(resolve, 1_500)).then(() => decode(...args))) as typeof createImageBitmap;
  });
  await signInAs(page, 'scout@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=14&position=3`);
  await expect(page.getByTestId('vine-address')).toContainText('Row 14 · Vine 3');
  await context.setOffline(true);
  try {
    await page.getByRole('button', { name: 'Weak budbreak' }).click();
    await page.getByLabel('Buds retained').fill('20');
    await page.getByLabel('Buds pushed').fill('8');
    await page.getByTestId('photo-input').setInputFiles(await testPhoto('slow'));
    await expect(page.getByTestId('photo-count')).toHaveText('Preparing 1 photo…');
    await page.getByRole('button', { name: 'Save and next vine' }).click();
    await expect(page.getByRole('status').filter({ hasText: 'Saved on this phone' })).toBeVisible();
    await expect(page.getByTestId('sync-status')).toHaveAttribute('data-photos-waiting', '1');
    await expect(page.getByTestId('vine-address')).toContainText('Row 14 · Vine 4');
    await page.getByRole('button', { name: 'Weak budbreak' }).click();
    await expect(page.getByTestId('photo-count')).toHaveText('No photos');
  } finally {
    await context.setOffline(false);
  }
});
