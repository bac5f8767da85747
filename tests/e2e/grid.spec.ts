import { expect, test, type Locator, type Page } from '@playwright/test';
import { LEVEL_STYLES } from '@/lib/grid/palette';
import { signInAs, waitForServiceWorker } from './helpers/session';

// Creek Flat, the demo's 150 × 150 block (db/seeds/demo-layout.ts).
const CREEK_FLAT = '0b10c4a0-0000-4000-8000-000000000002';
const ACT_NOW = LEVEL_STYLES[4]!.fill;

async function signInAsManager(page: Page) {
  await signInAs(page, 'manager@example.com');
  await waitForServiceWorker(page);
}

/** Where on the visible grid the first cell of a colour is, read from the canvas's own pixels. */
async function findCell(grid: Locator, hex: string) {
  return grid.evaluate((scroller, colour) => {
    const canvas = scroller.parentElement!.querySelector('canvas')!;
    const ctx = canvas.getContext('2d')!;
    const { data, width, height } = ctx.getImageData(0, 0, canvas.width, canvas.height);
    const [r, g, b] = [1, 3, 5].map((i) => parseInt(colour.slice(i, i + 2), 16));
    const scale = canvas.width / canvas.clientWidth;
    for (let y = 0; y < height; y++) {
      for (let x = 0; x < width; x++) {
        const i = (y * width + x) * 4;
        if (data[i] === r && data[i + 1] === g && data[i + 2] === b) return { x: x / scale + 3, y: y / scale + 3 };
      }
    }
    return null;
  }, hex);
}

async function imageLoaded(image: Locator) {
  await expect.poll(() => image.evaluate((img: HTMLImageElement) => (img.complete ? img.naturalWidth : 0)), { timeout: 10_000 }).toBeGreaterThan(0);
}

test('a manager opens the large demo block, filters to one kind, clicks a red cell and sees the vine’s photos', async ({ page }) => {
  await signInAsManager(page);
  await page.goto('/grid');
  await page.getByRole('link', { name: /Creek Flat/ }).click();
  await expect(page.getByRole('heading', { name: 'Creek Flat: row grid' })).toBeVisible();
  const grid = page.getByRole('grid', { name: /Row grid of Creek Flat: 150 rows/ });
  await expect(grid).toBeVisible();
  // Findings and records kept apart: pruning records are counted as work done, with no incidence.
  await expect(page.getByTestId('grid-findings-table').getByRole('rowheader', { name: 'Trunk injury' })).toBeVisible();
  await expect(page.getByTestId('grid-findings-table').getByRole('rowheader', { name: 'Pruning record' })).toHaveCount(0);
  await expect(page.getByTestId('grid-records-table').getByRole('rowheader', { name: 'Pruning record' })).toBeVisible();

  await page.getByText('Filters', { exact: false }).first().click();
  await page.getByLabel('Trunk injury').check();
  await expect(page).toHaveURL(/kind=trunk-injury/);
  await expect(page.getByTestId('grid-filter-summary')).toHaveText('Trunk injury · open findings');
  // The summary lists only the chosen kind once the filtered grid has arrived.
  await expect(page.getByRole('rowheader', { name: 'Trunk injury' })).toBeVisible();
  await expect(page.getByRole('rowheader', { name: 'Cane diameter' })).toHaveCount(0);

  const red = await findCell(grid, ACT_NOW);
  expect(red, 'an act-now cell in view').not.toBeNull();
  await grid.click({ position: red! });

  const panel = page.getByTestId('vine-panel');
  await expect(panel.getByRole('heading', { level: 2 })).toHaveText(/^Row \d+, post \d+, vine \d+$/);
  await expect(page).toHaveURL(/row=\d+&position=\d+/);
  const finding = panel.getByTestId('vine-observation').filter({ hasText: 'Trunk injury' }).filter({ hasText: 'Act now' });
  await expect(finding.first()).toBeVisible();
  const photo = panel.getByTestId('vine-photo').first();
  await expect(photo).toBeVisible();
  await imageLoaded(photo);

  await panel
    .getByRole('button', { name: /Open the photo/ })
    .first()
    .click();
  const viewer = page.getByRole('dialog');
  await expect(viewer).toBeVisible();
  const full = viewer.getByRole('img');
  await imageLoaded(full);
  expect(await full.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBeGreaterThan(320);
  await viewer.getByRole('button', { name: 'Close' }).click();
  await expect(viewer).toBeHidden();
});

test('keyboard navigation moves between cells, announces each vine and opens it with Enter', async ({ page }) => {
  await signInAsManager(page);
  await page.goto(`/grid/${CREEK_FLAT}`);
  const grid = page.getByRole('grid', { name: /Row grid of Creek Flat/ });
  await expect(grid).toHaveAttribute('aria-rowcount', '150');
  await grid.focus();
  const cell = page.locator('#grid-active-cell');
  await expect(cell).toHaveText(/^Row 1, post 1, vine 1: /);

  await page.keyboard.press('ArrowRight');
  await page.keyboard.press('ArrowRight');
  // Vine 3 of the headland row has the demo's worst trunk injury.
  await expect(cell).toHaveText('Row 1, post 1, vine 3: Act now.');
  await expect(page.getByTestId('grid-status')).toHaveText('Row 1, post 1, vine 3: Act now.');
  await page.keyboard.press('ArrowDown');
  await expect(cell).toHaveText(/^Row 2, post 1, vine 3: /);
  await page.keyboard.press('End');
  await expect(cell).toHaveAttribute('aria-colindex', '150');
  await expect(cell).toHaveText(/^Row 2, post 38, vine 2: /);
  await page.keyboard.press('PageDown');
  await expect(cell).toHaveText(/^Row 12, post 38, vine 2: /);
  await page.keyboard.press('Home');
  await expect(cell).toHaveText(/^Row 12, post 1, vine 1: /);

  await page.keyboard.press('Enter');
  await expect(page.getByTestId('vine-panel').getByRole('heading', { level: 2 })).toHaveText('Row 12, post 1, vine 1');
  await expect(page).toHaveURL(/row=12&position=1/);
  await page.keyboard.press('Escape');
  await expect(page.getByTestId('vine-panel')).toHaveCount(0);
});

test('the rows read as text for a screen reader, one summary per row', async ({ page }) => {
  await signInAsManager(page);
  await page.goto(`/grid/${CREEK_FLAT}?kind=trunk-injury`);
  await page.getByText('Rows as a list').click();
  const rows = page.getByRole('list').filter({ hasText: 'Row 150:' }).getByRole('listitem');
  await expect(rows).toHaveCount(150);
  await expect(rows.first()).toContainText(/^Row 1: \d+ act now \(vines 3, 9/);
});

test('"Next act now vine" goes straight to a worst vine and opens it', async ({ page }) => {
  await signInAsManager(page);
  await page.goto(`/grid/${CREEK_FLAT}`);
  await page.getByRole('button', { name: 'Next act now vine' }).click();
  const panel = page.getByTestId('vine-panel');
  await expect(panel.getByTestId('vine-observation').filter({ hasText: 'Act now' }).first()).toBeVisible();
  await expect(panel.getByRole('link', { name: 'Open this vine in the field app' })).toHaveAttribute(
    'href',
    new RegExp(`^/field/blocks/${CREEK_FLAT}/walk\\?row=\\d+&position=\\d+$`),
  );
});

test.describe('on a laptop', () => {
  test.use({ viewport: { width: 1366, height: 900 }, isMobile: false, hasTouch: false });

  test('a shared link opens the grid filtered, with the vine panel beside the grid', async ({ page }) => {
    await signInAsManager(page);
    await page.goto(`/grid/${CREEK_FLAT}?kind=trunk-injury&row=1&position=9`);
    const panel = page.getByTestId('vine-panel');
    await expect(panel.getByRole('heading', { level: 2 })).toHaveText('Row 1, post 3, vine 1');
    await imageLoaded(panel.getByTestId('vine-photo').first());
    const [gridBox, panelBox] = [await page.getByTestId('row-grid').boundingBox(), await panel.boundingBox()];
    expect(panelBox!.x).toBeGreaterThan(gridBox!.x + gridBox!.width);
    await expect(page.getByTestId('grid-filter-summary')).toHaveText('Trunk injury · open findings');
  });
});
