import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { codeWords } from '../helpers/code-words';
import { signInAs } from './helpers/session';

const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

async function axeViolations(page: Page) {
  const result = await new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
  return result.violations.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`);
}

// A desk page: the service worker's first-install reload would only race the typing.
test.use({ serviceWorkers: 'block' });

// Printable widths at 96 px per inch with 12 mm margins: A4 (210 mm) and US Letter (8.5 in).
const PAPER = {
  A4: { width: Math.floor(((210 - 24) / 25.4) * 96), height: Math.floor(((297 - 24) / 25.4) * 96) },
  Letter: { width: Math.floor((8.5 - 24 / 25.4) * 96), height: Math.floor((11 - 24 / 25.4) * 96) },
};

async function layoutProblems(page: Page) {
  return page.evaluate(() => {
    const width = document.documentElement.clientWidth;
    const problems: string[] = [];
    if (document.documentElement.scrollWidth > width + 1) problems.push(`page is ${document.documentElement.scrollWidth}px wide for ${width}px`);
    for (const el of document.querySelectorAll<HTMLElement>('.vw-report svg.recharts-surface, .vw-report table, .vw-report figure')) {
      const box = el.getBoundingClientRect();
      if (box.right > width + 1) problems.push(`${el.tagName.toLowerCase()} ends at ${Math.round(box.right)}px`);
    }
    return problems;
  });
}

const pdfPages = (pdf: Buffer) => (pdf.toString('latin1').match(/\/Type\s*\/Page(?![s\w])/g) ?? []).length;

test('a manager opens the demo block’s report, changes the crop inputs, sees the estimate change, and prints it', async ({ page }) => {
  await signInAs(page, 'manager@example.com');
  await page.goto('/reports');
  await expect(page.getByRole('heading', { name: /^Season \d{4}: all blocks$/ })).toBeVisible();
  await page.getByRole('link', { name: 'Creek Flat' }).click();
  await expect(page.getByRole('heading', { level: 1, name: /^Creek Flat: season \d{4}$/ })).toBeVisible();
  await expect(page.getByTestId('block-facts')).toContainText('Sauvignon Blanc');

  // Figures give their working in words, with the published source, behind a disclosure.
  const weak = page.getByTestId('fig-weak');
  // The working is in the disclosure on screen and printed apart on paper: look inside the disclosure.
  const working = weak.locator('details');
  await expect(working.getByText(/by Wilson's score interval/)).toBeHidden();
  await working.getByText('How this is worked out').click();
  await expect(
    working.getByText(/[\d,]+ of [\d,]+ vines checked were weak: [\d,]+ ÷ [\d,]+ = [\d.]+%; the 95% range around it, by Wilson's score interval/),
  ).toBeVisible();
  await expect(working.getByText(/^Source: E\. B\. Wilson \(1927\)/)).toBeVisible();
  await expect(page.getByTestId('incidence-trunk-injury')).toContainText('95% range');
  await expect(page.getByRole('heading', { name: /side by side/ })).toBeVisible();
  await expect(page.getByTestId('persisted-table')).toContainText('Trunk injury');

  const estimate = page.getByTestId('crop-estimate');
  const total = page.getByTestId('crop-total');
  await expect(total).toHaveText(/\d/);
  const before = (await total.textContent())!;
  await expect(estimate).toContainText('clusters per shoot 1.5: default');

  const clusters = page.getByLabel('Clusters per shoot');
  await clusters.fill('-1');
  await expect(page.getByRole('alert').filter({ hasText: 'Cannot be negative' })).toBeVisible();
  await expect(clusters).toHaveValue('-1');
  await expect(estimate).toContainText('Enter the clusters per shoot');

  await clusters.fill('2');
  await expect(estimate).toContainText('clusters per shoot 2: entered');
  await expect(total).not.toHaveText(before);
  await page.getByLabel('Cluster weight').fill('130');
  await expect(estimate).toContainText('cluster weight 130: entered');
  await expect(page).toHaveURL(/clustersPerShoot=2/);
  await expect(page).toHaveURL(/clusterWeightG=130/);
  const after = (await total.textContent())!;
  expect(after).not.toBe(before);

  // The estimate follows the inputs in proportion: 2 × 130 over 1.5 × the default weight.
  const weight = Number((await page.getByLabel('Cluster weight').getAttribute('placeholder'))!);
  const number = (text: string) => Number(text.replace(/[^\d.]/g, ''));
  expect(number(after) / number(before)).toBeCloseTo((2 * 130) / (1.5 * weight), 1);

  // The report says what the estimate rests on and how many vines next season's sample needs
  // (Wolpert & Vilas: from the CV of vine yields), and reads the bud load per foot of row.
  await expect(page.getByTestId('crop-rests-on')).toContainText(/buds kept per vine [\d.]+: mean buds kept on/);
  await expect(page.getByTestId('crop-sampling')).toContainText(/weigh or count \d+ vines/);
  await expect(page.getByTestId('bud-density')).toContainText(/buds kept per foot of row/);
  // Counted clusters replace buds × budbreak × clusters per shoot; a lag-phase weight is doubled (UMD).
  await page.getByLabel('Clusters counted per vine').fill('40');
  await page.getByLabel('Weight of a cluster at lag phase').fill('65');
  await expect(estimate).toContainText('× 40 clusters counted a vine × 130 g a cluster');
  await expect(estimate).toContainText('The harvest cluster weight is 65 g at lag phase × 2 = 130 g.');
  await expect(page.getByTestId('crop-rests-on')).toHaveText('Rests on: clusters counted per vine 40: entered; cluster weight at lag phase 65: entered.');
  await page.getByLabel('Clusters counted per vine').fill('');
  await page.getByLabel('Weight of a cluster at lag phase').fill('');
  await expect(total).toHaveText(after);

  // On paper: no navigation, toolbar or input boxes; the inputs used are printed instead; charts
  // and tables stay inside the page at A4 and at US Letter width.
  await page.emulateMedia({ media: 'print' });
  for (const [paper, size] of Object.entries(PAPER)) {
    await page.setViewportSize(size);
    await expect(page.getByRole('navigation', { name: 'Main' })).toBeHidden();
    await expect(page.getByTestId('report-toolbar')).toBeHidden();
    await expect(page.getByLabel('Clusters per shoot')).toBeHidden();
    await expect(page.getByText(/^Clusters per shoot: 2/)).toBeVisible();
    await expect(page.getByText(/^Cluster weight: 130/)).toBeVisible();
    await expect(page.getByTestId('report-chart').first()).toBeVisible();
    expect(await page.getByTestId('report-chart').count()).toBeGreaterThanOrEqual(4);
    await expect.poll(() => layoutProblems(page), { message: paper }).toEqual([]);
    const breakInside = await page.getByTestId('incidence-table').evaluate((t) => getComputedStyle(t).breakInside);
    expect(breakInside, paper).toBe('avoid');
  }

  for (const format of ['A4', 'Letter'] as const) {
    const pdf = await page.pdf({ format, margin: { top: '12mm', bottom: '12mm', left: '12mm', right: '12mm' }, printBackground: true });
    const pages = pdfPages(pdf);
    expect(pages, format).toBeGreaterThanOrEqual(3);
    expect(pages, format).toBeLessThanOrEqual(30);
  }
});

test('the demo block’s report opens with a contents list that reaches every section, keeps records out of the incidence, estimates the crop in kg and shows no code', async ({
  page,
}) => {
  await signInAs(page, 'manager@example.com');
  await page.goto('/reports');
  await page.getByRole('link', { name: 'Creek Flat' }).click();
  await expect(page.getByRole('heading', { level: 1, name: /^Creek Flat: season \d{4}$/ })).toBeVisible();

  const contents = page.getByRole('navigation', { name: 'Contents' });
  const links = contents.getByRole('link');
  expect(await links.count()).toBeGreaterThanOrEqual(13);
  for (const name of ['Incidence by problem', 'Pruning checks', 'Crop estimate', 'How these figures are made']) {
    const link = contents.getByRole('link', { name, exact: true });
    const href = (await link.getAttribute('href'))!;
    await link.click();
    await expect(page).toHaveURL(new RegExp(`${href}$`));
    await expect(page.locator(`section${href}`).getByRole('heading', { level: 2, name, exact: true })).toBeInViewport();
  }
  // Every link names a section that is on the page.
  for (const href of await links.evaluateAll((as) => as.map((a) => a.getAttribute('href')!))) {
    await expect(page.locator(`section${href}`)).toHaveCount(1);
  }

  // Incidence is over findings only; pruning records are reported as buds kept against the target.
  const incidence = page.getByTestId('incidence-table');
  await expect(incidence.getByRole('rowheader', { name: 'Trunk injury' })).toBeVisible();
  await expect(incidence.getByRole('rowheader', { name: /Pruning (record|check)/ })).toHaveCount(0);
  await expect(page.getByTestId('kept-on-vines')).toContainText(/Kept on a vine, on average: [\d.]+ canes of [\d.]+ buds each and [\d.]+ renewal spurs/);

  // The demo's crop estimate has a figure, in kg.
  await expect(page.getByTestId('crop-total')).toHaveText(/^[\d.,]+ (kg|t)$/);
  await expect(page.getByTestId('fig-crop-value')).toHaveText(/^[\d.,]+ (kg|t)$/);

  // No function names, settings paths or arrows anywhere in the report, working included.
  for (const summary of await page.locator('.vw-report details > summary').all()) await summary.click();
  // Text nodes one by one, outside the charts: innerText runs a chart's axis labels together.
  const text = await page.getByTestId('block-report').evaluate((root) => {
    const walker = document.createTreeWalker(root, NodeFilter.SHOW_TEXT);
    const parts: string[] = [];
    for (let node = walker.nextNode(); node; node = walker.nextNode()) if (!node.parentElement?.closest('svg')) parts.push(node.textContent ?? '');
    return parts.join(' ');
  });
  expect(text).toContain('How this is worked out');
  expect(codeWords(text)).toEqual([]);
  expect(await axeViolations(page)).toEqual([]);

  // On paper the contents list stays, before the sections.
  await page.emulateMedia({ media: 'print' });
  await expect(contents).toBeVisible();
  await expect(contents.getByText('Crop estimate')).toBeVisible();
});

test('every demo block’s crop estimate shows a figure', async ({ page }) => {
  await signInAs(page, 'manager@example.com');
  for (const name of ['Upper Terrace', 'Schoolhouse Slope', 'North Bench']) {
    await page.goto('/reports');
    await page.getByRole('link', { name }).click();
    await expect(page.getByRole('heading', { level: 1, name: new RegExp(`^${name}: season`) })).toBeVisible();
    await expect(page.getByTestId('crop-total'), name).toHaveText(/^[\d.,]+ (kg|t)$/);
  }
});

test('an advisor reads the estate report and the export’s column list but gets no weight form', async ({ page }) => {
  await signInAs(page, 'advisor@example.com');
  // The advisor also consults for a grower with no blocks yet, and starts there.
  await page.goto('/reports');
  await expect(page.getByText('There are no blocks yet')).toBeVisible();
  await page.getByLabel('Organisation').selectOption({ label: 'Ninefold Ridge Estate (advisor)' });
  await expect(page).not.toHaveURL(/\/reports/);
  await page.goto('/reports');
  await expect(page.getByTestId('estate-blocks-table')).toContainText('Schoolhouse Slope');
  await expect(page.getByTestId('estate-incidence-table')).toContainText('Winter bud injury');
  await page.getByRole('link', { name: 'About the CSV columns' }).click();
  await expect(page.getByTestId('csv-columns')).toContainText('observation_id');
  await expect(page.getByTestId('csv-columns')).toContainText('data_json');
  await page.goto('/reports');
  await page.getByRole('link', { name: 'Upper Terrace' }).click();
  await page.getByRole('link', { name: 'Yields and pruning weights' }).click();
  await expect(page.getByText('Advisors read these weights')).toBeVisible();
  await expect(page.getByRole('button', { name: 'Save weight' })).toHaveCount(0);
});

test('a pruner enters a row sample of prunings and sees it listed', async ({ page }) => {
  await signInAs(page, 'pruner@example.com');
  await page.goto('/reports');
  await page.getByRole('link', { name: 'North Bench' }).click();
  await page.getByRole('link', { name: 'Yields and pruning weights' }).click();
  await expect(page.getByRole('button', { name: 'Save weight' })).toBeEnabled();
  await page.getByText('Pruning weight', { exact: true }).click();
  await page.getByText('Row sample', { exact: true }).click();
  await page.getByLabel('Row', { exact: true }).fill('6');
  await page.getByLabel('Vines in the sample').fill('10');
  await page.getByLabel('Weight (kg)').fill('500');
  await page.getByRole('button', { name: 'Save weight' }).click();
  await expect(page.getByText(/more than 20 kg is unlikely/)).toBeVisible();
  await expect(page.getByLabel('Weight (kg)')).toHaveValue('500');
  await page.getByLabel('Weight (kg)').fill('6.4');
  await page.getByRole('button', { name: 'Save weight' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Saved: row 6 sample' })).toBeVisible();
  await expect(page.getByTestId('measurement-list')).toContainText('Row 6, sample of 10 vines');
});
