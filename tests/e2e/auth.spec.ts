import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';
import { formatDate } from '@/lib/domain/dates/format';

const roles = [
  { email: 'installer@nookpass.demo', role: 'Installer', nav: ['Projects', 'Quick check', 'Appliance library', 'Company', 'People', 'Audit', 'Account'], lands: '/projects' },
  { email: 'installer2@nookpass.demo', role: 'Installer', nav: ['Projects', 'Quick check', 'Appliance library', 'Company', 'Account'], lands: '/projects' },
  { email: 'inspector@nookpass.demo', role: 'Inspector', nav: ['Inspections', 'Account'], lands: '/inspections' },
  { email: 'admin@nookpass.demo', role: 'Admin', nav: ['Rules', 'Jurisdictions', 'Users', 'Audit', 'Account'], lands: '/rules' },
];

for (const r of roles) {
  test(`${r.role.toLowerCase()} ${r.email} signs in and sees their navigation`, async ({ page }) => {
    await signInAs(page, r.email);
    await expect(page).toHaveURL(new RegExp(`${r.lands}$`));
    await expect(page.getByTestId('shell-role')).toHaveText(r.role);
    const nav = page.getByRole('navigation', { name: 'Main' });
    await expect(nav.getByRole('link')).toHaveText(r.nav);
    await expect(page.getByText('Demo account')).toBeVisible();
  });
}

test('a wrong password and an unknown e-mail get the same generic error', async ({ page }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill('installer2@nookpass.demo');
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  const alert = page.locator('#sign-in-error');
  await expect(alert).toHaveText('That e-mail and password do not match an account.');

  await page.getByLabel('E-mail').fill('nobody@nookpass.demo');
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(alert).toHaveText('That e-mail and password do not match an account.');
  await expect(page).toHaveURL(/\/sign-in/);
});

test('an anonymous visit to /projects lands on sign-in and returns after it', async ({ page }) => {
  await page.goto('/projects');
  await expect(page).toHaveURL(/\/sign-in\?callbackUrl=%2Fprojects/);
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  await page.getByLabel('E-mail').fill('installer@nookpass.demo');
  await page.getByLabel('Password').fill(process.env.NOOKPASS_DEMO_PASSWORD || 'demo-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/projects$/);
});

// WHATWG URL standard: a backslash is a slash in http(s) URLs and tab is dropped, so both name another host.
for (const callbackUrl of ['%2F%5C127.0.0.1%3A8081%2Fpwned', '%2F%09%2F127.0.0.1%3A8081%2Fpwned']) {
  test(`sign-in with callbackUrl ${callbackUrl} stays on our origin`, async ({ page, baseURL }) => {
    await page.goto(`/sign-in?callbackUrl=${callbackUrl}`);
    await page.getByLabel('E-mail').fill('installer@nookpass.demo');
    await page.getByLabel('Password').fill(process.env.NOOKPASS_DEMO_PASSWORD || 'demo-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page).toHaveURL(/\/projects$/);
    expect(new URL(page.url()).origin).toBe(new URL(baseURL!).origin);
  });
}

test('an installer cannot open admin pages', async ({ page }) => {
  await signInAs(page, 'installer@nookpass.demo');
  await page.goto('/users');
  await expect(page).toHaveURL(/\/forbidden/);
  await expect(page.getByRole('heading', { name: /cannot open this page/ })).toBeVisible();
});

test('a user creates an API token, sees it once, and revokes it', async ({ page, request }) => {
  await signInAs(page, 'installer2@nookpass.demo');
  await page.getByRole('link', { name: 'Account' }).click();
  await page.getByLabel('Token name').fill('e2e laptop');
  await expect(page.getByLabel('Expires after')).toHaveValue('90');
  await page.getByLabel('Expires after').selectOption({ label: '30 days' });
  await page.getByRole('button', { name: 'Create token' }).click();
  const token = (await page.getByTestId('new-token').textContent())!.trim();
  expect(token).toMatch(/^np_/);
  const in30Days = new Date(Date.now() + 30 * 24 * 3600_000);
  const row = page.getByRole('listitem').filter({ has: page.getByRole('button', { name: 'Revoke token e2e laptop' }) }).first();
  // Account pages belong to no jurisdiction: the day is UTC's and says so, whatever the browser's zone.
  await expect(row.getByTestId('token-expiry')).toHaveText(`expires ${formatDate(in30Days, 'UTC')}`);
  await expect(row.getByTestId('token-expiry')).toContainText(', UTC');

  const me = await request.get('/api/me', { headers: { authorization: `Bearer ${token}` } });
  expect(me.status()).toBe(200);

  await page.getByRole('button', { name: 'Revoke token e2e laptop' }).click();
  await expect(page.getByRole('button', { name: 'Revoke token e2e laptop' })).toHaveCount(0);
  const after = await request.get('/api/me', { headers: { authorization: `Bearer ${token}` } });
  expect(after.status()).toBe(401);
});

test('signing out ends the session', async ({ page }) => {
  await signInAs(page, 'admin@nookpass.demo');
  // Settle on one page first: a click during the redirect that follows sign-in is lost to that redirect.
  await page.goto('/rules');
  await expect(page.getByRole('heading', { name: 'Rule sets' })).toBeVisible();
  await page.getByRole('link', { name: 'Sign out' }).click();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/\/sign-in/);
  await page.goto('/rules');
  await expect(page).toHaveURL(/\/sign-in/);
});

test('"Sign out everywhere else" on the account page signs out the other browser', async ({ browser }) => {
  const here = await browser.newContext();
  const there = await browser.newContext();
  const herePage = await here.newPage();
  const therePage = await there.newPage();
  await signInAs(herePage, 'installer2@nookpass.demo');
  await signInAs(therePage, 'installer2@nookpass.demo');

  await herePage.getByRole('link', { name: 'Account' }).click();
  await expect(herePage.getByRole('heading', { name: 'Where you are signed in' })).toBeVisible();
  await expect(herePage.getByTestId('session-list').getByText('This browser')).toHaveCount(1);
  await herePage.getByRole('button', { name: 'Sign out everywhere else' }).click();
  await expect(herePage.getByRole('status').filter({ hasText: /Signed out \d+ other session/ })).toBeVisible();

  await therePage.goto('/projects');
  await expect(therePage).toHaveURL(/\/sign-in/);
  await herePage.goto('/projects');
  await expect(herePage.getByTestId('shell-user')).toBeVisible();
  await here.close();
  await there.close();
});

test('a throttled sign-in says so and how long to wait', async ({ browser }) => {
  // A client address of its own (IPv6 documentation prefix, RFC 3849), so no other test shares its counters.
  const address = `2001:db8:e2e::${Math.floor(Math.random() * 0xffff).toString(16)}`;
  const context = await browser.newContext({ extraHTTPHeaders: { 'x-forwarded-for': address } });
  const page = await context.newPage();
  await page.goto('/sign-in');
  const alert = page.locator('#sign-in-error');
  for (let i = 0; i < 6; i++) {
    await page.getByLabel('E-mail').fill('someone-throttled@nookpass.demo');
    await page.getByLabel('Password').fill(`wrong-password-${i}`);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByRole('button', { name: 'Sign in' })).toBeEnabled();
  }
  await expect(alert).toHaveText('Too many failed sign-ins for this e-mail. Wait 15 minutes, then try again.');
  await context.close();
});
