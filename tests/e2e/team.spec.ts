import { createHash, randomBytes, randomUUID } from 'node:crypto';
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

test('a manager revokes a pending invitation on the team page, and its link stops working', async ({ page }) => {
  const db = testDb();
  const org = await db('organisations').where({ name: 'Ninefold Ridge Estate' }).first('id');
  const manager = await db('users').where({ email: 'manager@example.com' }).first('id');
  const token = randomBytes(32).toString('base64url');
  const email = `revoke-${randomUUID().slice(0, 8)}@example.com`;
  const [invitation] = await db('invitations')
    .insert({
      organisation_id: org.id,
      email,
      role: 'scout',
      token_hash: createHash('sha256').update(token).digest('hex'),
      invited_by: manager.id,
      expires_at: new Date(Date.now() + 7 * 24 * 3600 * 1000),
    })
    .returning('id');

  // The phone-sized screen: the button is there and big enough for a thumb.
  await page.setViewportSize({ width: 360, height: 740 });
  await signInAs(page, 'manager@example.com');
  await page.goto('/team');
  const item = page.getByTestId('open-invitation').filter({ hasText: email });
  const revoke = item.getByRole('button', { name: `Revoke the invitation for ${email}` });
  await expect(revoke).toBeVisible();
  expect((await revoke.boundingBox())!.height).toBeGreaterThanOrEqual(48);
  await revoke.click();
  await expect(item).toHaveCount(0);
  const row = await db('invitations').where({ id: invitation.id }).first('revoked_at', 'revoked_by');
  expect(row.revoked_at).not.toBeNull();
  expect(row.revoked_by).toBe(manager.id);

  await page.goto(`/invite/${token}`);
  await expect(page.getByText('This invitation was withdrawn by a manager.')).toBeVisible();
});
