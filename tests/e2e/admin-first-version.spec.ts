import { randomBytes } from 'node:crypto';
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { signInAs } from './helpers';

// WCAG 2.2 level AA, as axe-core tags its rules.
const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
const shots = 'test-results/e2e/screens';

async function expectAccessible(page: Page, at: string) {
  const { violations } = await new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
  expect(violations.map((v) => `${at}: ${v.id} ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)).toEqual([]);
}

// What must never reach the admin: a dotted parameter key, a JSON null, a machine-length decimal.
const DOTTED_PARAMETER = /\b(exhaust|makeupAir|gas|electrical|plumbing|service|doors|editions)\.[A-Za-z]/;
const LONG_DECIMAL = /\d\.\d{4,}/;

// IRC 2021 M1502.4.6.1: 35 ft = 420 in maximum developed length; the invented local amendment makes it 32 ft = 384 in.
const MODEL_MAX = `35' 0"`;
const LOCAL_MAX_IN = '384';
const LOCAL_MAX = `32' 0"`;

test('a new jurisdiction: created once, compared with the baseline before its first publication, published after one confirmation', async ({ page }) => {
  test.setTimeout(240_000);
  const slug = `e2e-first-${randomBytes(3).toString('hex')}`;
  await signInAs(page, 'admin@nookpass.demo');

  await page.goto('/jurisdictions/new');
  await page.getByLabel('Name', { exact: true }).fill('First version (test)');
  await page.getByLabel('Short name (in addresses)').fill(slug);
  await page.getByLabel('State or region').fill('Test State (invented)');
  await page.getByLabel('Building (residential) code').fill('IRC 2021');
  await page.getByLabel('Electrical code').fill('NEC 2023');
  await page.getByLabel('Plumbing code', { exact: true }).fill('IPC 2021');
  await page.getByLabel('Plumbing code family').selectOption('IPC');
  await page.getByLabel('Mechanical code').fill('IMC 2021');
  await page.getByLabel('Fuel gas code').fill('IFGC 2021');
  // The jurisdiction's clock: new ones start on UTC until the admin picks their zone.
  await expect(page.getByLabel('Time zone')).toHaveValue('UTC');
  await page.getByLabel('Time zone').selectOption('America/Denver');

  // Slow the create and the page it leads to, as a busy server would: the button must say it is
  // working and stay pressed until the draft page is there, or a second press re-sends the slug.
  await page.route('**/api/jurisdictions', async (route) => {
    if (route.request().method() === 'POST') await new Promise((r) => setTimeout(r, 1_000));
    await route.continue();
  });
  await page.route(`**/rules/${slug}/versions/**`, async (route) => {
    await new Promise((r) => setTimeout(r, 3_000));
    await route.continue();
  });
  const create = page.getByRole('button', { name: /Create jurisdiction and first draft|Creating…|Opening the first draft…/ });
  const created = page.waitForResponse((r) => r.url().endsWith('/api/jurisdictions') && r.request().method() === 'POST');
  await create.click();
  await expect(create).toHaveAttribute('aria-busy', 'true');
  await expect(create).toBeDisabled();
  expect((await created).status()).toBe(201);
  // The answer is in but the draft page is still loading: the button is still busy.
  await expect(create).toBeDisabled();
  await expect(create).toHaveAttribute('aria-busy', 'true');
  await expect(page.getByRole('heading', { name: 'Rule set version 1' })).toBeVisible({ timeout: 30_000 });
  await expect(page.getByText(/already used/)).toHaveCount(0);
  const listed = (await (await page.request.get('/api/jurisdictions')).json()) as { slug: string; timeZone: string }[];
  expect(listed.find((j) => j.slug === slug)?.timeZone).toBe('America/Denver');
  await page.unrouteAll({ behavior: 'wait' });

  // Before the first publication the draft is compared with the model-code baseline, without crashing.
  await page.getByRole('link', { name: 'Compare with the model-code baseline' }).click();
  await expect(page.getByRole('heading', { name: 'Model-code baseline → version 1' })).toBeVisible();
  await expect(page.getByTestId('diff')).toContainText('Parameters (0 changed)');
  await expect(page.getByTestId('diff')).toContainText('0 added, 0 removed, 0 changed');
  await expectAccessible(page, 'diff before publication');
  await page.goBack();

  // A local amendment to the maximum developed length.
  await expect(page.getByTestId('draft-revision')).toContainText('revision 1');
  await page.locator('#p-exhaust-maxDevelopedLengthIn').fill(LOCAL_MAX_IN);
  await page.getByLabel(new RegExp(`Changed from the model value ${MODEL_MAX}`)).fill('Ord. E2E-1 §2 (test)');
  await page.getByRole('button', { name: 'Save parameters' }).click();
  await expect(page.getByTestId('parameters-status')).toHaveText('Parameters saved to the draft.', { timeout: 30_000 });
  await expect(page.getByTestId('draft-revision')).toContainText('revision 2');
  // The hinge chart's 1000 mm door (hinge makers' charts, common practice) reads to four decimals, not ten.
  await expect(page.locator('#p-doors-hingeCountChart-0-maxDoorHeightIn')).toHaveValue('39.3701');
  // The form speaks the trade: labels from the parameter descriptions, no keys or machine decimals.
  const form = page.getByRole('form', { name: 'Rule set parameters' });
  await expect(form.getByText('Maximum developed length', { exact: true })).toBeVisible();
  expect(await form.innerText()).not.toMatch(DOTTED_PARAMETER);

  // The first version's dry run compares with the baseline: only the amendment can change anything.
  await page.getByRole('button', { name: 'Dry-run this draft' }).click();
  await expect(page.getByTestId('dry-run-against')).toContainText('model-code baseline', { timeout: 60_000 });
  await expect(page.getByTestId('dry-run')).not.toContainText('new rule');

  // Save the note, then publish at once from the same tab: the publish waits for the save and
  // sends the revision it answered with, so it is not refused as someone else's change.
  const NOTE = 'Version 1 (test): model codes with a 32 ft maximum developed length by Ord. E2E-1 §2.';
  await page.getByLabel('Changelog note (shown to installers)').fill(NOTE);
  await page.getByRole('button', { name: 'Save note' }).click();
  await page.getByRole('button', { name: 'Publish version 1' }).click();
  const dialog = page.getByRole('dialog', { name: 'Publish version 1?' });
  await expect(dialog).toBeVisible();
  await expect(dialog.getByTestId('publish-dialog-changelog')).toHaveText(NOTE);
  await expect(dialog.getByTestId('publish-dialog-impact')).toContainText('open projects in this jurisdiction would change');
  await expect(page.getByTestId('conflict')).toHaveCount(0);
  await expect(page.getByTestId('draft-revision')).toContainText('revision 3');
  await expectAccessible(page, 'publish confirmation');
  await page.screenshot({ path: `${shots}/admin-publish-confirm.png`, fullPage: true });
  // The baseline's from-memory citations are not checked yet: the same dialog says so.
  await expect(dialog.getByTestId('publish-confirm-list')).not.toBeEmpty();
  await dialog.getByRole('button', { name: 'Publish with them unchecked' }).click();
  await expect(page.getByTestId('published-notice')).toContainText('Version 1 is published');
  await expect(page.getByTestId('conflict')).toHaveCount(0);

  // The diff with the baseline names the parameter and shows lengths in feet and inches.
  await page.goto(`/rules/${slug}/diff?from=baseline&to=1`);
  const row = page.locator('[data-diff-path="exhaust.maxDevelopedLengthIn"]');
  await expect(row.getByRole('rowheader')).toHaveText('Maximum developed length');
  await expect(row.locator('[data-side="from"]')).toHaveText(MODEL_MAX);
  await expect(row.locator('[data-side="to"]')).toHaveText(LOCAL_MAX);
  const parameters = await page.getByRole('region', { name: /^Parameters/ }).innerText();
  expect(parameters).not.toMatch(DOTTED_PARAMETER);
  expect(parameters).not.toMatch(LONG_DECIMAL);
  expect(parameters).not.toMatch(/\bnull\b/);
  await expectAccessible(page, 'diff after publication');
});
