import { randomBytes } from 'node:crypto';
import { join } from 'node:path';
import { expect, test, type Page } from '@playwright/test';
import { signInAs } from './helpers';
import { formatDate } from '@/lib/domain/dates/format';

const shots = 'test-results/e2e/screens';
const AGAINST = '2021 IRC as adopted by ordinance 12-34 (demo)';
const editions = { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' };
// axe-core, as installed in node_modules (the accessibility rules the e2e tests check against).
const axePath = join(process.cwd(), 'node_modules/axe-core/axe.min.js');

/** WCAG 2.2 AA (axe) on the given part of the page. */
async function expectAccessible(page: Page, selector: string) {
  await page.addScriptTag({ path: axePath });
  const violations = await page.evaluate(async (include) => {
    const axe = (window as unknown as { axe: { run: (ctx: unknown, opts: unknown) => Promise<{ violations: { id: string; nodes: { target: unknown[] }[] }[] }> } }).axe;
    const result = await axe.run({ include: [include] }, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] } });
    return result.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  }, selector);
  expect(violations).toEqual([]);
}

test('the jurisdiction form refuses a plumbing edition of another family, next to the field', async ({ page }) => {
  await signInAs(page, 'admin@nookpass.demo');
  await page.goto('/jurisdictions/new');
  await page.getByLabel('Name', { exact: true }).fill('Mismatched (test)');
  await page.getByLabel('Short name (in addresses)').fill(`it-e2e-mismatch-${randomBytes(3).toString('hex')}`);
  await page.getByLabel('State or region').fill('Test State (invented)');
  await page.getByLabel('Building (residential) code').fill('IRC 2021');
  await page.getByLabel('Electrical code').fill('NEC 2023');
  // UPC 804.1 (18–30 in) is not the IPC's 18–42 in standpipe (TRADE.md, plumbing).
  await page.getByLabel('Plumbing code', { exact: true }).fill('UPC 2024');
  await page.getByLabel('Plumbing code family').selectOption('IPC');
  await page.getByLabel('Mechanical code').fill('IMC 2021');
  await page.getByLabel('Fuel gas code').fill('IFGC 2021');
  await page.getByRole('button', { name: 'Create jurisdiction and first draft' }).click();
  await expect(page.locator('#j-editions-plumbing-error')).toContainText('UPC 2024 is a UPC edition, but the plumbing family is IPC');
  await expect(page.locator('#j-editions-plumbing')).toHaveAttribute('aria-invalid', 'true');
  await expect(page).toHaveURL(/\/jurisdictions\/new$/);
});

test('an admin marks citations checked against the adopted text, and confirms publishing the rest unchecked', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'admin@nookpass.demo');
  const slug = `it-e2e-cite-${randomBytes(3).toString('hex')}`;
  const created = await page.request.post('/api/jurisdictions', {
    data: { slug, name: `Citations ${slug} (test)`, region: 'Test State (invented)', editions, inspectorEmail: '', amendmentNotes: 'Throwaway test jurisdiction.', startFrom: 'baseline' },
  });
  expect(created.status()).toBe(201);
  const { draft } = await created.json();
  const list = await (await page.request.get(`/api/rule-sets/${draft.id}/citations`)).json();
  const memory = list.uncheckedMemory as { ruleKey: string; title: string; citation: string }[];
  expect(memory.length).toBeGreaterThan(1);
  const [checked, left] = memory;

  await page.goto(`/rules/${slug}/versions/${draft.version}`);
  const section = page.locator('section[aria-labelledby="cite-h"]');
  await expect(section.getByTestId('citation-summary')).toContainText(`${memory.length} from memory still unchecked`);
  const row = section.locator(`[data-testid="citation-row"][data-rule="${checked.ruleKey}"]`);
  await expect(row).toHaveAttribute('data-checked', 'no');
  // Marking needs to say what it was checked against.
  await row.getByRole('button', { name: 'Mark checked' }).click();
  await expect(row.getByRole('alert')).toContainText('Say what you checked the citation against');
  await row.getByLabel('Checked against (the adopted text)').fill(AGAINST);
  await row.getByRole('button', { name: 'Mark checked' }).click();
  const marked = section.locator(`[data-testid="citation-row"][data-rule="${checked.ruleKey}"]`);
  await expect(marked).toHaveAttribute('data-checked', 'yes');
  await expect(marked.getByTestId('citation-state')).toContainText(`Checked by Casey Demo (admin) on ${formatDate(new Date(), 'UTC')} against ${AGAINST}`); // a new jurisdiction keeps UTC until an admin picks its zone
  await expect(section.getByTestId('citation-summary')).toContainText(`${memory.length - 1} from memory still unchecked`);
  for (const width of [1280, 390]) {
    await page.setViewportSize({ width, height: 900 });
    await expectAccessible(page, 'section[aria-labelledby="cite-h"]');
  }
  await page.setViewportSize({ width: 1280, height: 900 });

  // Publishing asks for confirmation and lists what is still unchecked; going back publishes nothing.
  await page.getByLabel('Changelog note (shown to installers)').fill('Version 1 (test): model codes, some citations checked.');
  await page.getByRole('button', { name: `Publish version ${draft.version}` }).click();
  // One publish dialog asks about everything: changelog, impact, and the citations still unchecked.
  const confirm = page.getByTestId('publish-dialog');
  await expect(confirm).toBeVisible();
  // Two rules may share a section (IMC 504.6 covers the closet opening and the exhaust rate): each line names its rule.
  await expect(confirm.getByTestId('publish-confirm-list')).toContainText(`${left.citation} — ${left.title}`);
  await expect(confirm.getByTestId('publish-confirm-list')).not.toContainText(`${checked.citation} — ${checked.title}`);
  await expect(confirm.getByTestId('publish-confirm')).toContainText('Citations not yet checked against the adopted text');
  await expectAccessible(page, '[data-testid="publish-dialog"]');
  await page.screenshot({ path: `${shots}/admin-publish-confirm.png`, fullPage: true });
  await confirm.getByRole('button', { name: 'Go back and check them' }).click();
  await expect(confirm).toHaveCount(0);
  expect((await (await page.request.get(`/api/rule-sets/${draft.id}`)).json()).status).toBe('draft');

  await page.getByRole('button', { name: `Publish version ${draft.version}` }).click();
  await page.getByRole('button', { name: 'Publish with them unchecked' }).click();
  await expect(page.getByTestId('published-notice')).toContainText(`Version ${draft.version} is published`, { timeout: 60_000 }); // the impact page may compile first under next dev

  // The published version keeps the marks, read-only.
  await page.goto(`/rules/${slug}/versions/${draft.version}`);
  const kept = page.locator(`[data-testid="citation-row"][data-rule="${checked.ruleKey}"]`);
  await expect(kept).toHaveAttribute('data-checked', 'yes');
  await expect(kept.getByRole('button', { name: /Mark checked|Check again/ })).toHaveCount(0);
});
