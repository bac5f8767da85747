import { randomUUID } from 'node:crypto';
import { expect, test } from '@playwright/test';
import { closeTestDb, testDb } from '../helpers/fixtures';
import { signInAs } from './helpers/session';

test.afterAll(closeTestDb);

test('a manager sees mail that may not have arrived on the team page, and dismisses it', async ({ page }) => {
  const db = testDb();
  const org = await db('organisations').where({ name: 'Ninefold Ridge Estate' }).first('id');
  const scout = await db('users').where({ email: 'scout@example.com' }).first('id', 'email');
  const id = randomUUID();
  const subject = `Comment on row 4 (${id.slice(0, 6)})`;
  await db('mail_outbox').insert({
    id,
    organisation_id: org.id,
    user_id: scout.id,
    to_email: scout.email,
    kind: 'comment',
    dedupe_key: `e2e:${id}`,
    subject,
    text_body: subject,
    html_body: `<p>${subject}</p>`,
    status: 'uncertain',
    attempts: 1,
  });

  await signInAs(page, 'manager@example.com');
  await page.goto('/team');
  await expect(page.getByRole('heading', { name: 'Mail that may not have arrived' })).toBeVisible();
  const item = page.getByTestId('undelivered-mail').filter({ hasText: subject });
  await expect(item).toContainText('it may have arrived');
  await item.getByRole('button', { name: 'Dismiss' }).click();
  await expect(item).toHaveCount(0);
  expect((await db('mail_outbox').where({ id }).first('status')).status).toBe('dismissed');
});
