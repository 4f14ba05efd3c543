import { randomBytes } from 'node:crypto';
import { expect, test, type APIRequestContext } from '@playwright/test';

/*
 * A company signs itself up and confirms its e-mail from the local test inbox; a person resets a
 * forgotten password from the e-mail and the session they had before is refused.
 */

const inbox = process.env.NOOKPASS_INBOX_URL ?? 'http://127.0.0.1:54326';
const tag = () => randomBytes(4).toString('hex');
// Sign-ups and resets are counted per client address; each test stands for a machine of its own (RFC 3849 documentation prefix).
const address = () => `2001:db8:e2e::${randomBytes(2).toString('hex')}:${randomBytes(2).toString('hex')}`;

async function linkFromInbox(request: APIRequestContext, to: string, path: string): Promise<string> {
  for (let i = 0; i < 80; i++) {
    const messages = (await (await request.get(`${inbox}/api/messages`)).json()) as { id: string; to: string; text: string }[];
    const mine = messages.filter((m) => m.to === to && m.text.includes(path)).sort((a, b) => a.id.localeCompare(b.id));
    const m = mine.length ? new RegExp(`https?://\\S+${path}[A-Za-z0-9_-]+`).exec(mine.at(-1)!.text) : null;
    if (m) return new URL(m[0]).pathname;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no e-mail to ${to} with ${path}`);
}

test('a new company signs up, confirms its e-mail and sets its details', async ({ browser, request }) => {
  const t = tag();
  const email = `e2e-owner-${t}@example.test`;
  const company = `E2E Closets ${t} (test)`;
  const context = await browser.newContext({ extraHTTPHeaders: { 'x-forwarded-for': address() } });
  const page = await context.newPage();

  await page.goto('/sign-in');
  await page.getByRole('link', { name: 'Sign up your company' }).click();
  await expect(page.getByRole('heading', { name: 'Sign up your company' })).toBeVisible();
  await page.waitForLoadState('networkidle');
  await page.getByLabel('Company name').fill(company);
  await page.getByLabel('Your name').fill(`Owner ${t}`);
  await page.getByLabel('Work e-mail').fill(email);
  await page.getByLabel('Password').fill('too short');
  await page.getByRole('button', { name: 'Sign up your company' }).click();
  // The reason sits beside the field, tied to it for screen readers.
  await expect(page.locator('#sign-up-password-error')).toContainText('at least 12 characters');
  await expect(page.getByLabel('Password')).toHaveAttribute('aria-describedby', /sign-up-password-error/);
  await page.getByLabel('Password').fill(email);
  await page.getByRole('button', { name: 'Sign up your company' }).click();
  await expect(page.locator('#sign-up-password-error')).toContainText('cannot be your e-mail address');
  await page.getByLabel('Password').fill('a sensible long password');
  await page.getByRole('button', { name: 'Sign up your company' }).click();
  await expect(page).toHaveURL(/\/projects/);
  await expect(page.getByTestId('shell-user')).toBeVisible();

  await page.goto('/account');
  await expect(page.getByTestId('email-status')).toContainText('Not confirmed yet');

  const link = await linkFromInbox(request, email, '/confirm-email/');
  await page.goto(link);
  await page.getByRole('button', { name: 'Confirm my e-mail address' }).click();
  await expect(page.getByText('Your e-mail address is confirmed.')).toBeVisible();
  await page.goto('/account');
  await expect(page.getByTestId('email-status')).toHaveText('Confirmed');
  // The link works once.
  await page.goto(link);
  await expect(page.getByRole('heading', { name: 'This link was already used' })).toBeVisible();

  await page.goto('/company');
  await page.waitForLoadState('networkidle');
  await page.getByLabel('Contractor licence number (optional)').fill(`E2E-LIC-${t}`);
  await page.getByLabel('Default jurisdiction (optional)').selectOption('demo-county');
  await page.getByRole('button', { name: 'Save company details' }).click();
  await expect(page.getByText('Saved. Reports issued from now on carry these details.')).toBeVisible();
  await page.goto('/projects/new');
  await expect(page.getByLabel('Jurisdiction (AHJ)')).toHaveValue('demo-county');
  await context.close();
});

test('a person resets a forgotten password and their old session is refused', async ({ browser, request }) => {
  const t = tag();
  const email = `e2e-forgetful-${t}@example.test`;
  const old = await browser.newContext({ extraHTTPHeaders: { 'x-forwarded-for': address() } });
  const oldPage = await old.newPage();
  await oldPage.goto('/sign-up');
  await oldPage.waitForLoadState('networkidle');
  await oldPage.getByLabel('Company name').fill(`E2E Forgetful ${t} (test)`);
  await oldPage.getByLabel('Your name').fill(`Forgetful ${t}`);
  await oldPage.getByLabel('Work e-mail').fill(email);
  await oldPage.getByLabel('Password').fill('the first long password');
  await oldPage.getByRole('button', { name: 'Sign up your company' }).click();
  await expect(oldPage.getByTestId('shell-user')).toBeVisible();

  const fresh = await browser.newContext({ extraHTTPHeaders: { 'x-forwarded-for': address() } });
  const page = await fresh.newPage();
  await page.goto('/sign-in');
  await page.getByRole('link', { name: 'Forgot your password?' }).click();
  await expect(page.getByRole('heading', { name: 'Forgot your password?' })).toBeVisible();
  // The form takes over the field when it hydrates (resetting it to empty); type after that.
  await page.waitForLoadState('networkidle');
  await page.getByLabel('E-mail').fill(email);
  await page.getByRole('button', { name: 'Send me a reset link' }).click();
  await expect(page.getByText('If this e-mail address has a NookPass account')).toBeVisible();

  const link = await linkFromInbox(request, email, '/reset-password/');
  await page.goto(link);
  await page.waitForLoadState('networkidle');
  await page.getByLabel('New password').fill('short');
  await page.getByRole('button', { name: 'Set new password' }).click();
  await expect(page.locator('#reset-password-error')).toContainText('at least 12 characters');
  await page.getByLabel('New password').fill('the second long password');
  await page.getByRole('button', { name: 'Set new password' }).click();
  await expect(page).toHaveURL(/\/sign-in\?notice=password-reset/);
  await expect(page.getByText('Your password is changed')).toBeVisible();
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill('the second long password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByTestId('shell-user')).toBeVisible();

  // The session from before the reset is over: the API says 401 and the app sends the browser to sign-in.
  expect((await oldPage.request.get('/api/me')).status()).toBe(401);
  await oldPage.goto('/projects');
  await expect(oldPage).toHaveURL(/\/sign-in/);
  // The link was spent.
  await page.goto(link);
  await expect(page.getByRole('heading', { name: 'This link was already used' })).toBeVisible();
  await old.close();
  await fresh.close();
});
