import { readFileSync } from 'node:fs';
import path from 'node:path';
import { expect, test, type Page } from '@playwright/test';
import { closeTestDb, makeMember, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';

// Each test works in a fresh organisation, so the demo estate stays as the other tests expect it.
test.afterAll(closeTestDb);
// These pages are desk pages; the service worker's first-install reload would only race the typing.
test.use({ serviceWorkers: 'block' });

async function signIn(page: Page, email: string, password = PASSWORD) {
  await page.goto('/signin');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/(desk|field)$/);
}

interface BlockFields {
  name: string;
  rowSpacing: string;
  vineSpacing: string;
  variety?: string;
  clone?: string;
  rootstock?: string;
  plantingYear?: string;
  training?: 'Cane' | 'Spur';
  rows?: string;
  vines?: string;
  perPanel?: string;
  origin?: string;
}

async function createBlockThroughForm(page: Page, o: BlockFields) {
  await page.goto('/blocks');
  await page.getByRole('link', { name: 'New block' }).click();
  await expect(page.getByRole('button', { name: 'Create block' })).toBeEnabled();
  await page.getByLabel('Name', { exact: true }).fill(o.name);
  await page.getByLabel('Variety').fill(o.variety ?? 'Tempranillo');
  await page.getByLabel('Clone (optional)').fill(o.clone ?? 'TE-4');
  await page.getByLabel('Rootstock (optional)').fill(o.rootstock ?? '110R');
  await page.getByLabel('Planting year (optional)').fill(o.plantingYear ?? '2018');
  await page.getByText(o.training ?? 'Spur', { exact: true }).click();
  await page.getByLabel('Row spacing').fill(o.rowSpacing);
  await page.getByLabel('Vine spacing in the row').fill(o.vineSpacing);
  await page.getByLabel('Number of rows').fill(o.rows ?? '3');
  await page.getByLabel('Vines per row').fill(o.vines ?? '10');
  await page.getByLabel('Vines per panel (optional)').fill(o.perPanel ?? '5');
  if (o.origin) await page.getByLabel('Where vine 1 stands (optional)').fill(o.origin);
  await page.getByRole('button', { name: 'Create block' }).click();
  await expect(page.getByRole('heading', { level: 1, name: o.name })).toBeVisible();
}

test('a manager creates a block through the form, imports a layout CSV and sees the counts', async ({ page }) => {
  const team = await makeTeam();
  await signIn(page, team.manager.email);
  await createBlockThroughForm(page, { name: 'Windmill Rows', rowSpacing: '2.5', vineSpacing: '1.2' });

  await expect(page.getByTestId('count-slots')).toHaveText('30');
  await expect(page.getByTestId('count-planted')).toHaveText('30');
  await expect(page.getByText('2.5 m between rows, 1.2 m between vines')).toBeVisible();
  // lib/viticulture: 10 000 / (2.5 × 1.2) = 3333 vines per hectare.
  await expect(page.getByText('3,333 vines/ha')).toBeVisible();

  await page.getByRole('link', { name: 'Import layout CSV' }).click();
  await expect(page.getByLabel('Layout CSV file')).toBeEnabled();
  await page.getByLabel('Layout CSV file').setInputFiles(path.join(__dirname, '../fixtures/layout/small-block.csv'));
  const summary = page.getByTestId('layout-summary');
  await expect(summary).toContainText('Rows added: 4');
  await expect(summary).toContainText('Rows resized: row 3 10 → 12');
  await expect(summary).toContainText('Planting slots: 30 → 40 (10 added, 0 removed)');
  await expect(summary).toContainText('1 vine planted → missing');
  // The preview wrote nothing.
  const block = await testDb()('blocks').where({ organisation_id: team.org.id, name: 'Windmill Rows' }).first('id', 'row_count');
  expect(block.row_count).toBe(3);

  await page.getByRole('button', { name: 'Apply this layout' }).click();
  await expect(page.getByText('Layout imported.')).toBeVisible();
  await page.getByRole('link', { name: 'Back to Windmill Rows' }).click();

  await expect(page.getByTestId('count-slots')).toHaveText('40');
  await expect(page.getByTestId('count-planted')).toHaveText('37');
  await expect(page.getByTestId('count-missing')).toHaveText('1');
  await expect(page.getByTestId('count-dead')).toHaveText('1');
  await expect(page.getByTestId('count-replant')).toHaveText('1');

  await page.getByRole('button', { name: 'Row 2 vines' }).click();
  await page.getByRole('button', { name: 'row 2, post 1, vine 3: missing' }).click();
  await expect(page.getByRole('heading', { name: 'row 2, post 1, vine 3' })).toBeVisible();
  await expect(page.getByText('Planted 2018, TE-4 on 110R — missing')).toBeVisible();

  await page.goto('/blocks');
  const row = page.getByRole('row').filter({ hasText: 'Windmill Rows' });
  await expect(row).toContainText('Tempranillo');
  await expect(row).toContainText('40');
});

test('a manager sets up a demo block from scratch with the form and its layout file, and sees the demo counts', async ({ page }) => {
  const team = await makeTeam();
  await signIn(page, team.manager.email);
  await createBlockThroughForm(page, {
    name: 'North Bench',
    variety: 'Chardonnay',
    clone: 'CH-95',
    rootstock: '5C',
    plantingYear: '2019',
    training: 'Cane',
    rowSpacing: '2.4',
    vineSpacing: '1.4',
    rows: '12',
    vines: '45',
    perPanel: '5',
    origin: 'Vine 1 at the shed end',
  });
  await page.getByRole('link', { name: 'Import layout CSV' }).click();
  await expect(page.getByLabel('Layout CSV file')).toBeEnabled();
  await page.getByLabel('Layout CSV file').setInputFiles(path.join(__dirname, '../fixtures/layout/demo/north-bench.csv'));
  await expect(page.getByTestId('layout-summary')).toContainText('Rows resized: row 1 45 → 30, row 2 45 → 34, row 3 45 → 38, row 4 45 → 42');
  await page.getByRole('button', { name: 'Apply this layout' }).click();
  await page.getByRole('link', { name: 'Back to North Bench' }).click();

  // The file is the seeded demo block's own export, so these are the demo estate's counts.
  const letters = readFileSync(path.join(__dirname, '../fixtures/layout/demo/north-bench.csv'), 'utf8')
    .split('\n')
    .slice(1)
    .map((l) => l.split(',')[2] ?? '')
    .join('');
  const count = (letter: string) => String([...letters].filter((l) => l === letter).length);
  await expect(page.getByTestId('count-slots')).toHaveText(String(8 * 45 + 30 + 34 + 38 + 42));
  await expect(page.getByTestId('count-planted')).toHaveText(count('P'));
  await expect(page.getByTestId('count-missing')).toHaveText(count('M'));
  await expect(page.getByTestId('count-dead')).toHaveText(count('D'));
  await expect(page.getByTestId('count-replant')).toHaveText(count('R'));
  await expect(page.getByText('2.4 m between rows, 1.4 m between vines')).toBeVisible();
});

test('a bad layout file shows what is wrong line by line and changes nothing', async ({ page }) => {
  const team = await makeTeam();
  await signIn(page, team.manager.email);
  await createBlockThroughForm(page, { name: 'Gully Block', rowSpacing: '2.5', vineSpacing: '1.2' });
  await page.getByRole('link', { name: 'Import layout CSV' }).click();
  await expect(page.getByLabel('Layout CSV file')).toBeEnabled();
  await page.getByLabel('Layout CSV file').setInputFiles({
    name: 'bad.csv',
    mimeType: 'text/csv',
    buffer: Buffer.from('row,vines\n1,10\n1,10\n3,ten\n'),
  });
  const alert = page.getByRole('alert').filter({ hasText: 'Nothing was changed' });
  await expect(alert).toContainText('Line 3: row 1 is listed twice (also on line 2) (and 1 more problem). Nothing was changed.');
  await expect(alert.getByRole('list', { name: 'Problems by line' })).toContainText('Line 4: vines "ten" is not a whole number.');
  await expect(page.getByRole('button', { name: 'Apply this layout' })).toHaveCount(0);
});

test('a form with bad fields shows the same messages as the server and creates nothing', async ({ page }) => {
  const team = await makeTeam();
  await signIn(page, team.manager.email);
  await page.goto('/blocks/new');
  await expect(page.getByRole('button', { name: 'Create block' })).toBeEnabled();
  await page.getByLabel('Row spacing').fill('wide');
  await page.getByLabel('Number of rows').fill('0');
  await page.getByRole('button', { name: 'Create block' }).click();
  await expect(page.getByText('Give the block a name')).toBeVisible();
  await expect(page.getByText('A block has between 1 and 1000 rows')).toBeVisible();
  await expect(page.getByText('Type metres, e.g. 2.4, or 2400 mm')).toBeVisible();
  expect(await testDb()('blocks').where({ organisation_id: team.org.id })).toEqual([]);
});

test('on an imperial estate spacings are typed and shown in feet and inches', async ({ page }) => {
  const team = await makeTeam();
  await signIn(page, team.manager.email);
  await page.goto('/settings');
  await page.getByText('Imperial', { exact: true }).click();
  await page.getByRole('button', { name: 'Save units' }).click();
  await expect(page.getByText('Lengths now show in feet and inches, areas in acres.')).toBeVisible();

  await createBlockThroughForm(page, { name: 'Barn Rows', rowSpacing: "9'", vineSpacing: '6 ft' });
  await expect(page.getByText('9 ft between rows, 6 ft between vines')).toBeVisible();
  // BC Wine Grape Council table: 6 × 9 ft → 807 vines per acre.
  await expect(page.getByText('807 vines/acre')).toBeVisible();
  const stored = await testDb()('blocks').where({ organisation_id: team.org.id, name: 'Barn Rows' }).first('row_spacing_m', 'vine_spacing_m');
  expect(stored).toEqual({ row_spacing_m: '2.743', vine_spacing_m: '1.829' });
});

test('a scout sees the same block pages read-only', async ({ page }) => {
  const team = await makeTeam();
  const [block] = await testDb()('blocks')
    .insert({
      organisation_id: team.org.id,
      name: 'Quiet Corner',
      variety: 'Grenache',
      row_spacing_m: 2.4,
      vine_spacing_m: 1.2,
      row_count: 1,
      vines_per_row: 4,
    })
    .returning('id');
  await testDb()('block_rows').insert({ block_id: block.id, row_number: 1, vine_count: 4 });
  await testDb()('vine_positions').insert([1, 2, 3, 4].map((p) => ({ block_id: block.id, row_number: 1, position: p, status: p === 2 ? 'dead' : 'planted' })));
  const scout = await makeMember(team.org.id, 'scout');

  await signIn(page, scout.email);
  await page.goto('/blocks');
  await expect(page.getByRole('link', { name: 'New block' })).toHaveCount(0);
  await page.getByRole('link', { name: 'Quiet Corner' }).click();
  await expect(page.getByTestId('count-dead')).toHaveText('1');
  await expect(page.getByRole('link', { name: 'Edit block' })).toHaveCount(0);
  await expect(page.getByRole('link', { name: 'Import layout CSV' })).toHaveCount(0);
  await page.getByRole('button', { name: 'Row 1 vines' }).click();
  await page.getByRole('button', { name: 'row 1, vine 2: dead' }).click();
  await expect(page.getByRole('group', { name: 'Set the status' })).toHaveCount(0);

  await page.goto(`/blocks/${block.id}/edit`);
  await expect(page).toHaveURL(/\/field$/);
});
