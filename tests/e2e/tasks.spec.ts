import { randomUUID } from 'node:crypto';
import { expect, test, type Browser } from '@playwright/test';
import { closeTestDb, testDb } from '../helpers/fixtures';
import { mailsTo } from '../helpers/mail';
import { testPhoto } from './helpers/photos';
import { signInAs, waitForServiceWorker, waitingOnPhone } from './helpers/session';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const PRUNER_ID = '8a6b2c10-1d4e-4f3a-8b7c-000000000003';
const ROW = 20;

test.afterAll(closeTestDb);

/** Another person on another phone: a fresh browser context with the project's phone settings. */
async function phoneOf(browser: Browser, email: string) {
  const context = await browser.newContext({
    baseURL: process.env.APP_URL ?? 'http://localhost:3100',
    viewport: { width: 360, height: 740 },
    isMobile: true,
    hasTouch: true,
  });
  const page = await context.newPage();
  await signInAs(page, email);
  return page;
}

async function until<T>(read: () => Promise<T>, ok: (value: T) => boolean, timeoutMs = 30_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (ok(value)) return value;
    if (Date.now() > deadline) throw new Error(`Timed out; last value ${JSON.stringify(value)}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

test('a pruner flags vines offline, the manager makes a task of it, the pruner works it on the phone, and an advisor’s comment reaches the scout by mail', async ({
  page,
  browser,
}) => {
  test.setTimeout(240_000);

  // The scout's finding on the vine, recorded earlier in the season.
  const scout = await phoneOf(browser, 'scout@example.com');
  const findingId = randomUUID();
  const recorded = await scout.request.post('/api/sync', {
    data: {
      observations: [
        {
          id: findingId,
          blockId: UPPER_TERRACE,
          row: ROW,
          position: 33,
          kind: 'trunk-injury',
          data: { cause: 'cold', severity: 'moderate', girdlingPercent: 30 },
          note: 'Bark split',
          observedAt: new Date().toISOString(),
        },
      ],
    },
  });
  expect((await recorded.json()).results[0].status).toBe('created');
  await scout.context().close();

  // 1. The pruner, out of signal, flags a run of two vines.
  await signInAs(page, 'pruner@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=${ROW}&position=33`);
  await expect(page.getByTestId('vine-address')).toContainText(`Row ${ROW} · Vine 33`);
  await expect(page.getByRole('button', { name: /Flag for extra care/ })).toBeVisible();
  await page.context().setOffline(true);
  await page.getByRole('button', { name: /Flag for extra care/ }).click();
  await page.getByRole('group', { name: 'What does the vine need?' }).getByRole('button', { name: 'Trunk renewal' }).click();
  await page.getByRole('button', { name: '+1' }).click();
  await expect(page.getByLabel('Up to vine (same row)')).toHaveValue('34');
  await page.getByLabel('Note', { exact: true }).fill('Split at the graft, keep the low sucker');
  await page.getByRole('button', { name: 'Save the flag on this phone' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Flag saved on this phone' })).toBeVisible();
  expect(await waitingOnPhone(page)).toEqual({ records: 1, photos: 0 });

  await page.context().setOffline(false);
  await page.getByRole('button', { name: 'Sync now' }).click();
  await expect.poll(() => waitingOnPhone(page), { timeout: 30_000 }).toEqual({ records: 0, photos: 0 });
  const flag = await testDb()('flags').where({ block_id: UPPER_TERRACE, row_number: ROW, position: 33 }).first();
  expect(flag).toMatchObject({ to_position: 34, reason: 'trunk-renewal', flagged_by: PRUNER_ID, status: 'open' });

  // 2. The manager ticks the flag and makes a task of it for the pruner.
  const manager = await phoneOf(browser, 'manager@example.com');
  await manager.goto('/flags');
  await manager.getByLabel('Not in a task yet').check();
  await manager.getByRole('checkbox', { name: `Choose Trunk renewal at Upper Terrace, Row ${ROW}, vines 33–34` }).check();
  await expect(manager.getByText('1 flag chosen: one task.')).toBeVisible();
  await manager.getByLabel('Who does it').selectOption({ label: 'Rosa Quintal (pruner)' });
  await manager.getByLabel('Title (optional)').fill('Renew trunks, row 20');
  await manager.getByRole('button', { name: 'Make the task' }).click();
  await expect(manager.getByRole('link', { name: 'Renew trunks, row 20', exact: true })).toBeVisible();
  const assignment = await until(
    async () => (await mailsTo('pruner@example.com')).filter((m) => m.subject === 'New task for you: Renew trunks, row 20'),
    (m) => m.length === 1,
  );
  expect(assignment[0]!.text).toContain('/field/tasks?task=');

  // 3. The pruner works the task vine by vine on the phone, the second with a photo. A slow phone:
  // each photo takes a second and a half to decode, and "Save as done" is pressed before it is ready.
  await page.addInitScript(() => {
    const decode = window.createImageBitmap.bind(window);
    window.createImageBitmap = ((...args: Parameters<typeof createImageBitmap>) =>
      new Promise((resolve) => setTimeout(resolve, 1_500)).then(() => decode(...args))) as typeof createImageBitmap;
  });
  await page.goto('/field/tasks');
  const card = page.getByTestId('my-task').filter({ hasText: 'Renew trunks, row 20' });
  await expect(card).toContainText('0 of 2 vines done');
  await card.getByRole('link', { name: /Work this task/ }).click();
  await expect(page.getByTestId('vine-address')).toContainText(`Row ${ROW} · Vine 33`);
  const step = page.getByTestId('task-step');
  await expect(step).toContainText('Vine 1 of 2 in “Renew trunks, row 20”');
  await expect(step).toContainText('Why: Trunk renewal');
  await step.getByRole('button', { name: /Mark this vine done/ }).click();
  await step.getByLabel('Note (optional)').fill('Sucker tied up');
  await step.getByRole('button', { name: 'Save as done' }).click();
  await expect(page.getByTestId('vine-address')).toContainText(`Row ${ROW} · Vine 34`);
  await step.getByRole('button', { name: /Mark this vine done/ }).click();
  await step.getByTestId('task-photo-input').setInputFiles(await testPhoto('renewed'));
  await expect(step.getByRole('status').filter({ hasText: 'Preparing 1 photo…' })).toBeVisible();
  await step.getByRole('button', { name: 'Save as done' }).click();
  await expect(page.getByTestId('task-vine-done')).toBeVisible();
  await expect(page.getByText('Every vine of this task is done.')).toBeVisible();
  await expect.poll(() => waitingOnPhone(page), { timeout: 60_000 }).toEqual({ records: 0, photos: 0 });

  const task = await testDb()('tasks').where({ title: 'Renew trunks, row 20' }).first();
  expect(task).toMatchObject({ status: 'done', assignee_id: PRUNER_ID });
  expect(await testDb()('flags').where({ id: flag.id }).first()).toMatchObject({ status: 'closed', closed_by: PRUNER_ID });
  const items = await testDb()('task_items').where({ task_id: task.id }).orderBy('position');
  expect(items.map((i) => [i.position, i.status, i.note])).toEqual([
    [33, 'done', 'Sucker tied up'],
    [34, 'done', ''],
  ]);
  const photos = await testDb()('photos').where({ observation_id: items[1].observation_id });
  expect(photos).toHaveLength(1);
  expect(photos[0].status).toBe('stored');

  await manager.goto(`/tasks/${task.id}`);
  await expect(manager.getByTestId('task-summary')).toContainText('done');
  await expect(manager.getByTestId('task-summary')).toContainText('2 of 2 vines done');
  await manager.context().close();

  // 4. The advisor comments on the scout's finding on that vine; the scout gets the mail.
  const advisor = await phoneOf(browser, 'advisor@example.com');
  // The advisor consults for two growers; this vine is the estate's.
  // The advisor already sits on the desk, so the URL says nothing: wait for the switch itself.
  const switched = advisor.waitForResponse((r) => r.url().endsWith('/api/organisations/current') && r.request().method() === 'PUT');
  await advisor.getByLabel('Organisation').selectOption({ label: 'Ninefold Ridge Estate (advisor)' });
  expect((await switched).status()).toBe(200);
  await expect(advisor).toHaveURL(/\/desk$/);
  await advisor.goto(`/grid/${UPPER_TERRACE}?row=${ROW}&position=33`);
  const panel = advisor.getByTestId('vine-panel');
  const finding = panel.getByTestId('vine-observation').filter({ hasText: 'Bark split' });
  await finding.getByText('Comments on this finding').click();
  await finding.getByLabel('Add a comment').fill('Cold split: renew from the sucker the pruner kept. See https://example.com/trunk-renewal');
  await finding.getByRole('button', { name: 'Comment', exact: true }).click();
  await expect(finding.getByTestId('comment')).toContainText('Cold split: renew from the sucker');
  await expect(finding.getByRole('link', { name: 'https://example.com/trunk-renewal' })).toBeVisible();
  const mail = await until(
    async () => (await mailsTo('scout@example.com')).filter((m) => m.text.includes('Cold split: renew from the sucker')),
    (m) => m.length > 0,
  );
  expect(mail).toHaveLength(1);
  expect(mail[0]!.subject).toBe('Dr. Anselm Pryde commented on your finding');
  expect(mail[0]!.text).toContain(`/grid/${UPPER_TERRACE}?row=${ROW}&position=33`);
  await advisor.context().close();
});

test('a crew lead records a pruning check with no signal, and the check counts in the pruner’s deviation', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'pruner@example.com');
  await page.goto('/field');
  await waitForServiceWorker(page);
  await page.goto(`/field/blocks/${UPPER_TERRACE}/walk?row=22&position=10`);
  await expect(page.getByTestId('vine-address')).toContainText('Row 22 · Vine 10');
  // Opened once with signal, the form keeps the crew list on the phone.
  await page.getByRole('button', { name: 'Pruning check' }).click();
  await expect(page.getByRole('group', { name: 'Whose pruning is checked' })).toBeVisible();
  await page.getByRole('button', { name: 'Cancel' }).click();

  await page.context().setOffline(true);
  await page.reload();
  await page.getByRole('button', { name: 'Pruning check' }).click();
  await page.getByRole('group', { name: 'Whose pruning is checked' }).getByRole('button', { name: 'Rosa Quintal' }).click();
  await page.getByLabel('Canes kept').fill('2');
  await page.getByLabel('Buds left on the canes or spurs').fill('30');
  await page.getByLabel('Renewal spurs').fill('2');
  await page.getByLabel('Block target, buds per vine (optional)').fill('28');
  await expect(page.getByTestId('check-feedback')).toContainText('34 buds left on this vine');
  await expect(page.getByTestId('check-feedback')).toContainText('21% more buds than the target of 28');
  await page.getByRole('button', { name: 'Save on this phone' }).click();
  await expect.poll(() => waitingOnPhone(page)).toEqual({ records: 1, photos: 0 });

  await page.context().setOffline(false);
  await page.getByRole('button', { name: 'Sync now' }).click();
  await expect.poll(() => waitingOnPhone(page), { timeout: 30_000 }).toEqual({ records: 0, photos: 0 });
  const stored = await testDb()('observations').where({ block_id: UPPER_TERRACE, kind: 'pruning-check', row_number: 22, position: 10 }).first();
  expect(stored).toMatchObject({
    recorded_by: PRUNER_ID,
    severity: 1,
    data: { prunedBy: PRUNER_ID, canesKept: 2, budsOnCanes: 30, renewalSpurs: 2, budTarget: 28 },
  });

  await page.goto('/tasks/pruning-checks');
  await expect(page.getByTestId('pruner-row').filter({ hasText: 'Rosa Quintal' })).toBeVisible();
  await expect(page.getByRole('link', { name: 'Upper Terrace, row 22, vine 10' })).toBeVisible();
});
