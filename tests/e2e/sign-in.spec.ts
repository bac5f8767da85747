import { expect, test, type Page } from '@playwright/test';

async function signIn(page: Page, email: string, password: string) {
  await page.goto('/signin');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

test('the demo manager signs in through the page and lands on the desk', async ({ page }) => {
  await signIn(page, 'manager@example.com', 'vineward-demo');
  await expect(page).toHaveURL(/\/desk$/);
  await expect(page.getByRole('heading', { name: 'Desk' })).toBeVisible();
  await expect(page.getByText('Ninefold Ridge Estate').first()).toBeVisible();
  // On a phone the desk pages are behind the header's menu.
  await page.getByText('Menu', { exact: true }).click();
  await expect(page.getByRole('link', { name: 'Team', exact: true })).toBeVisible();
});

test('the demo scout signs in through the page and lands in the field', async ({ page }) => {
  await signIn(page, 'scout@example.com', 'vineward-demo');
  await expect(page).toHaveURL(/\/field$/);
  await expect(page.getByRole('heading', { name: 'Field' })).toBeVisible();
  await expect(page.getByRole('link', { name: 'Team', exact: true })).toHaveCount(0);
});

test('a wrong password shows a clear message and stays on the sign-in page', async ({ page }) => {
  await signIn(page, 'manager@example.com', 'not-the-password');
  await expect(page.getByRole('alert').filter({ hasText: 'match' })).toContainText('That e-mail and password do not match');
  await expect(page).toHaveURL(/\/signin/);
});

test('a signed-out visitor is sent to the sign-in page', async ({ page }) => {
  await page.goto('/desk');
  await expect(page).toHaveURL(/\/signin/);
});

test('an advisor switching organisation without a connection is told so and stays where they were', async ({ page }) => {
  await signIn(page, 'advisor@example.com', 'vineward-demo');
  await expect(page).toHaveURL(/\/desk$/);
  const picker = page.getByLabel('Organisation');
  const before = await picker.inputValue();
  await page.context().setOffline(true);
  await picker.selectOption({ label: 'Ninefold Ridge Estate (advisor)' });
  await expect(page.getByRole('alert').filter({ hasText: 'Could not switch organisation: no connection.' })).toBeVisible();
  await expect(picker).toHaveValue(before);
  await page.context().setOffline(false);
});

test('the way to sign in is a labelled pair of pressed buttons, not tabs', async ({ page }) => {
  await page.goto('/signin');
  const choice = page.getByRole('group', { name: 'How to sign in' });
  const password = choice.getByRole('button', { name: 'Password' });
  const link = choice.getByRole('button', { name: 'E-mail me a link' });
  await expect(page.getByRole('tablist')).toHaveCount(0);
  await expect(password).toHaveAttribute('aria-pressed', 'true');
  await expect(link).toHaveAttribute('aria-pressed', 'false');
  await link.click();
  await expect(link).toHaveAttribute('aria-pressed', 'true');
  await expect(password).toHaveAttribute('aria-pressed', 'false');
  await expect(page.getByLabel('Password')).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'Send me a sign-in link' })).toBeVisible();
  // A keyboard reaches both with Tab and presses with Space, as any button.
  await password.focus();
  await page.keyboard.press('Space');
  await expect(password).toHaveAttribute('aria-pressed', 'true');
  await expect(page.getByLabel('Password')).toBeVisible();
});
