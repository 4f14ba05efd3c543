import { randomBytes } from 'node:crypto';
import { expect, test, type Browser, type BrowserContext, type Page } from '@playwright/test';
import { signInAs } from './helpers';

/*
 * The whole accounts loop, reading every link from the local test inbox: a company signs up and confirms
 * its e-mail, invites a teammate who sees the company's projects only; an admin invites a Demo County
 * inspector who sees its inspections; the teammate resets a forgotten password and the old session is
 * refused; the owner deactivates the teammate, whose session and API token then get 401.
 */

const inbox = process.env.NOOKPASS_INBOX_URL ?? 'http://127.0.0.1:54326';
const tag = randomBytes(4).toString('hex');
// Sign-ups, resets and invitations are counted per client address: each person stands for a machine of their own (RFC 3849).
const address = () => `2001:db8:e2e::${randomBytes(2).toString('hex')}:${randomBytes(2).toString('hex')}`;

/** The newest link under `path` in the mail to `to`. */
async function linkFromInbox(to: string, path: string): Promise<string> {
  for (let i = 0; i < 80; i++) {
    const messages = (await (await fetch(`${inbox}/api/messages`)).json()) as { id: string; to: string; text: string }[];
    const mine = messages.filter((m) => m.to.toLowerCase() === to && m.text.includes(path)).sort((a, b) => a.id.localeCompare(b.id));
    const m = mine.length ? new RegExp(`https?://\\S+${path}[A-Za-z0-9_-]+`).exec(mine.at(-1)!.text) : null;
    if (m) return new URL(m[0]).pathname;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no e-mail to ${to} with ${path}`);
}

async function person(browser: Browser): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ extraHTTPHeaders: { 'x-forwarded-for': address() } });
  return { context, page: await context.newPage() };
}

async function acceptInvitation(page: Page, link: string, name: string, password: string) {
  await page.goto(link);
  await expect(page.getByTestId('invitation')).toHaveAttribute('data-state', 'pending');
  await page.waitForLoadState('networkidle');
  await page.getByLabel('Your name').fill(name);
  await page.getByLabel('Choose a password').fill(password);
  await page.getByRole('button', { name: 'Accept and create my account' }).click();
  await expect(page).toHaveURL(/\/(projects|inspections)$/);
  await expect(page.getByTestId('shell-user')).toHaveText(name);
}

test('sign up, confirm, invite a teammate and an inspector, reset a password, deactivate', async ({ browser }) => {
  test.setTimeout(300_000);
  const ownerEmail = `loop-owner-${tag}@example.test`;
  const teammateEmail = `loop-teammate-${tag}@example.test`;
  const inspectorEmail = `loop-inspector-${tag}@example.test`;
  const project = `Loop closet ${tag} (test)`;

  // 1. A new company signs up and confirms its e-mail.
  const owner = await person(browser);
  await owner.page.goto('/sign-up');
  await owner.page.waitForLoadState('networkidle');
  await owner.page.getByLabel('Company name').fill(`Loop Closets ${tag} (test)`);
  await owner.page.getByLabel('Your name').fill(`Loop Owner ${tag}`);
  await owner.page.getByLabel('Work e-mail').fill(ownerEmail);
  await owner.page.getByLabel('Password').fill('the owner long password');
  await owner.page.getByRole('button', { name: 'Sign up your company' }).click();
  await expect(owner.page).toHaveURL(/\/projects/);
  await owner.page.goto(await linkFromInbox(ownerEmail, '/confirm-email/'));
  await owner.page.getByRole('button', { name: 'Confirm my e-mail address' }).click();
  await expect(owner.page.getByText('Your e-mail address is confirmed.')).toBeVisible();
  const created = await owner.page.request.post('/api/projects', { data: { name: project, siteAddress: '1 Loop Row (invented)', jurisdiction: 'demo-county' } });
  expect(created.status()).toBe(201);

  // 2. The owner invites a teammate, who accepts and sees the company's project and no other company's.
  await owner.page.goto('/people');
  await owner.page.waitForLoadState('networkidle');
  await owner.page.getByLabel('E-mail').fill(teammateEmail);
  await owner.page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(owner.page.getByTestId('invite-sent')).toContainText(teammateEmail);
  const teammate = await person(browser);
  await acceptInvitation(teammate.page, await linkFromInbox(teammateEmail, '/invitations/'), `Loop Teammate ${tag}`, 'the teammate first password');
  await teammate.page.goto('/projects');
  await expect(teammate.page.getByText(project)).toBeVisible();
  await expect(teammate.page.getByText('Demo — hall closet pair, 12 Example Lane')).toHaveCount(0);
  await expect(teammate.page.getByText('Demo — second company hall closet, 300 Fictional Ave')).toHaveCount(0);

  // 3. An admin invites an inspector for Demo County, who accepts and sees that jurisdiction's inspections.
  const admin = await person(browser);
  await signInAs(admin.page, 'admin@nookpass.demo');
  await admin.page.goto('/users');
  await admin.page.waitForLoadState('networkidle');
  await admin.page.getByLabel('E-mail').fill(inspectorEmail);
  await admin.page.getByLabel('Role', { exact: true }).last().selectOption('inspector');
  await admin.page.getByLabel('Jurisdiction', { exact: true }).selectOption('demo-county');
  await admin.page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(admin.page.getByTestId('invite-sent')).toContainText(inspectorEmail);
  const inspector = await person(browser);
  await acceptInvitation(inspector.page, await linkFromInbox(inspectorEmail, '/invitations/'), `Loop Inspector ${tag}`, 'the inspector long password');
  await expect(inspector.page).toHaveURL(/\/inspections$/);
  await expect(inspector.page.getByText('Demo County').first()).toBeVisible();

  // 4. The teammate forgets the password and resets it elsewhere: the session from before is refused.
  const elsewhere = await person(browser);
  await elsewhere.page.goto('/forgot-password');
  await elsewhere.page.waitForLoadState('networkidle');
  await elsewhere.page.getByLabel('E-mail').fill(teammateEmail);
  await elsewhere.page.getByRole('button', { name: 'Send me a reset link' }).click();
  await expect(elsewhere.page.getByText('If this e-mail address has a NookPass account')).toBeVisible();
  await elsewhere.page.goto(await linkFromInbox(teammateEmail, '/reset-password/'));
  await elsewhere.page.waitForLoadState('networkidle');
  await elsewhere.page.getByLabel('New password').fill('the teammate second password');
  await elsewhere.page.getByRole('button', { name: 'Set new password' }).click();
  await expect(elsewhere.page).toHaveURL(/\/sign-in/);
  await elsewhere.page.waitForLoadState('networkidle');
  await elsewhere.page.getByLabel('E-mail').fill(teammateEmail);
  await elsewhere.page.getByLabel('Password').fill('the teammate second password');
  await elsewhere.page.getByRole('button', { name: 'Sign in' }).click();
  await expect(elsewhere.page.getByTestId('shell-user')).toBeVisible();
  expect((await teammate.page.request.get('/api/me')).status()).toBe(401);

  // 5. The teammate makes an API token; the owner deactivates them; the session and the token get 401.
  const tokenRes = await elsewhere.page.request.post('/api/tokens', { data: { name: 'loop token' } });
  expect(tokenRes.status()).toBe(201);
  const token = (await tokenRes.json()).token as string;
  expect((await elsewhere.page.request.get('/api/me', { headers: { authorization: `Bearer ${token}` } })).status()).toBe(200);
  await owner.page.reload();
  const row = owner.page.locator(`tr[data-email="${teammateEmail}"]`);
  await row.getByRole('button', { name: /^Deactivate/ }).click();
  await expect(row.getByTestId('person-status')).toContainText('Deactivated');
  expect((await elsewhere.page.request.get('/api/me')).status()).toBe(401);
  expect((await elsewhere.page.request.get('/api/me', { headers: { authorization: `Bearer ${token}` } })).status()).toBe(401);

  for (const p of [owner, teammate, admin, inspector, elsewhere]) await p.context.close();
});
