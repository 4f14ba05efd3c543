import { expect, test, type Browser, type Page } from '@playwright/test';
import { signInAs } from './helpers';

const shots = 'test-results/e2e/screens';
const inbox = process.env.NOOKPASS_INBOX_URL ?? 'http://127.0.0.1:54326';
const PASSWORD = 'teammate-e2e-password';

/** The invitation link in the newest message to `email`, from the local test inbox. */
async function invitationLink(email: string): Promise<string> {
  for (let i = 0; i < 200; i++) {
    const messages = (await (await fetch(`${inbox}/api/messages`)).json()) as Array<{ to: string; text: string }>;
    const link = messages.find((m) => m.to.toLowerCase().includes(email))?.text.match(/https?:\/\/\S+\/invitations\/[A-Za-z0-9_-]{43}/)?.[0];
    if (link) return new URL(link).pathname;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no invitation reached ${email}`);
}

/** Opens the link in a fresh browser, accepts with a name and password, and lands signed in. */
async function acceptInvitation(browser: Browser, path: string, name: string): Promise<Page> {
  const page = await (await browser.newContext()).newPage();
  await page.goto(path);
  await expect(page.getByTestId('invitation')).toHaveAttribute('data-state', 'pending');
  // The form takes over its fields when it hydrates; type after that.
  await page.waitForLoadState('networkidle');
  await page.getByLabel('Your name').fill(name);
  // The policy refuses a short password beside the field before anything is sent.
  await page.getByLabel('Choose a password').fill('too-short');
  await page.getByRole('button', { name: 'Accept and create my account' }).click();
  await expect(page.locator('#accept-password-error')).toContainText('at least 12 characters');
  await page.getByLabel('Choose a password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Accept and create my account' }).click();
  // Signed in, on the role's start page.
  await expect(page).toHaveURL(/\/(projects|inspections)$/);
  await expect(page.getByTestId('shell-user')).toHaveText(name);
  return page;
}

test('an owner invites a teammate who sees the company’s projects, then deactivates them: session and token get 401', async ({ page, browser }) => {
  test.setTimeout(180_000);
  const email = `teammate-${Date.now()}@example.test`;
  await signInAs(page, 'installer@nookpass.demo');
  await page.getByRole('link', { name: 'People' }).click();
  await expect(page).toHaveURL(/\/people$/);
  await page.waitForLoadState('networkidle');
  await page.getByLabel('E-mail').fill(email);
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByTestId('invite-sent')).toContainText(email);
  await expect(page.getByTestId('pending-invitations')).toContainText(email);
  await page.screenshot({ path: `${shots}/people.png`, fullPage: true });

  const link = await invitationLink(email);
  const teammate = await acceptInvitation(browser, link, 'Taylor Teammate (test)');
  await teammate.goto('/projects');
  // Other tests add projects to the demo company: search, so the demo project is on the first page.
  await teammate.getByLabel('Search projects').fill('hall closet');
  await expect(teammate.getByText('Demo — hall closet pair, 12 Example Lane')).toBeVisible();
  await expect(teammate.getByText('Demo — second company hall closet, 300 Fictional Ave')).toHaveCount(0);
  // A teammate is not an owner: no people administration.
  await expect(teammate.getByRole('link', { name: 'People' })).toHaveCount(0);

  // The used link now says so.
  const again = await (await browser.newContext()).newPage();
  await again.goto(link);
  await expect(again.getByTestId('invitation')).toHaveAttribute('data-state', 'accepted');
  await expect(again.getByRole('heading')).toContainText('already been used');

  const created = await teammate.request.post('/api/tokens', { data: { name: 'e2e teammate token' } });
  expect(created.status()).toBe(201);
  const token = (await created.json()).token as string;
  expect((await teammate.request.get('/api/me', { headers: { authorization: `Bearer ${token}` } })).status()).toBe(200);

  await page.reload();
  const row = page.locator(`tr[data-email="${email}"]`);
  await row.getByRole('button', { name: /^Deactivate/ }).click();
  await expect(row.getByTestId('person-status')).toContainText('Deactivated');

  expect((await teammate.request.get('/api/me')).status()).toBe(401);
  expect((await teammate.request.get('/api/me', { headers: { authorization: `Bearer ${token}` } })).status()).toBe(401);
  await teammate.goto('/projects');
  await expect(teammate).toHaveURL(/\/sign-in/);
  await teammate.waitForLoadState('networkidle');
  await teammate.getByLabel('E-mail').fill(email);
  await teammate.getByLabel('Password').fill(PASSWORD);
  await teammate.getByRole('button', { name: 'Sign in' }).click();
  await expect(teammate.locator('#sign-in-error')).toContainText('deactivated');

  // The owner's audit page shows what happened.
  await page.goto(`/audit?person=${encodeURIComponent(email)}`);
  await expect(page.getByTestId('audit-table')).toContainText('Deactivated');
  await expect(page.getByTestId('audit-table')).toContainText('Invitation accepted');
  await expect(page.getByTestId('audit-table')).toContainText('Invitation sent');
});

test('an admin invites an inspector for Demo County who accepts and sees that jurisdiction’s inspections', async ({ page, browser }) => {
  test.setTimeout(120_000);
  const email = `county-inspector-${Date.now()}@example.test`;
  await signInAs(page, 'admin@nookpass.demo');
  await page.goto('/users');
  await page.waitForLoadState('networkidle');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Role', { exact: true }).last().selectOption('inspector');
  await page.getByLabel('Jurisdiction', { exact: true }).selectOption('demo-county');
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByTestId('invite-sent')).toContainText(email);
  await expect(page.getByTestId('pending-invitations')).toContainText('Demo County');

  const inspector = await acceptInvitation(browser, await invitationLink(email), 'Morgan Inspector (test)');
  await expect(inspector).toHaveURL(/\/inspections$/);
  await expect(inspector.getByText('Demo County').first()).toBeVisible();
  await inspector.screenshot({ path: `${shots}/invited-inspector.png`, fullPage: true });

  // The admin finds the new inspector by search and filter.
  await page.goto(`/users?q=${encodeURIComponent(email)}&role=inspector`);
  await expect(page.getByTestId('people-table').locator('tbody tr')).toHaveCount(1);
  await expect(page.locator(`tr[data-email="${email}"]`)).toContainText('Demo County');
});
