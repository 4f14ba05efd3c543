import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { signInAs } from './helpers';
import { formatDate } from '@/lib/domain/dates/format';

// WCAG 2.2 level AA, as axe-core tags its rules.
const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
const phone = { width: 390, height: 844 };
const desktop = { width: 1280, height: 900 };
const shots = 'test-results/e2e/screens';

async function expectAxeClean(page: Page, where: string) {
  await page.waitForLoadState('networkidle');
  const { violations } = await new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
  expect(violations.map((v) => `${where}: ${v.id} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`)).toEqual([]);
}

/** An installer's project with a passing plan, checked and sent to Demo County's inspector; returns what the tests need. */
async function sendReport(page: Page, tag: string) {
  const permit = `BP-${tag}`;
  const project = await page.request.post('/api/projects', { data: { name: `E2E comments ${tag} (test)`, siteAddress: `7 ${tag} Way`, permitNumber: permit, jurisdiction: 'demo-county' } });
  const projectId = ((await project.json()) as { id: string }).id;
  expect((await page.request.post(`/api/projects/${projectId}/plans`, { data: { plan: hallClosetPassPlan } })).status()).toBe(201);
  const check = (await (await page.request.post(`/api/projects/${projectId}/checks`, { data: {} })).json()) as { id: string; findings: Array<{ ruleKey: string; title: string; status: string }> };
  const sent = await page.request.post(`/api/checks/${check.id}/send`, { data: { to: 'inspector@nookpass.demo', confirmFailingFindings: true } });
  expect(sent.status()).toBe(201);
  const code = ((await sent.json()) as { report: { code: string } }).report.code;
  return { projectId, checkId: check.id, findings: check.findings, code, permit };
}

test('the inspector comments on a passed finding and the installer sees it beside that finding', async ({ page, browser }) => {
  test.setTimeout(240_000);
  const tag = `c${Date.now().toString(36)}`;
  await signInAs(page, 'installer2@nookpass.demo');
  const { projectId, checkId, findings, code } = await sendReport(page, tag);
  const passed = findings.find((f) => f.status === 'pass')!;
  expect(passed).toBeTruthy();

  const ctx = await browser.newContext();
  const insp = await ctx.newPage();
  await signInAs(insp, 'inspector@nookpass.demo');
  await insp.goto(`/inspections?q=${code}`);
  await insp.getByRole('row', { name: new RegExp(code) }).getByRole('link').click();
  await expect(insp.getByRole('heading', { name: new RegExp(`E2E comments ${tag}`) })).toBeVisible();
  // Passed findings are folded away but take a comment like any other.
  await insp.getByText(/Comments on passed and not applicable findings/).click();
  await insp.locator(`[id="fc-${passed.ruleKey}"]`).fill('Checked on site: matches the drawing.');
  await insp.getByLabel('Approved').check();
  await insp.getByRole('button', { name: 'Record outcome' }).click();
  await expect(insp.getByText(/Outcome recorded/)).toBeVisible();
  await ctx.close();

  await page.goto(`/projects/${projectId}/checks/${checkId}`);
  const finding = page.locator(`[data-rule="${passed.ruleKey}"]`);
  // The filter shows what needs attention first; a commented finding stays in view even though it passed.
  await expect(finding).toBeVisible();
  await expect(finding).toHaveAttribute('data-status', 'pass');
  const comment = finding.getByTestId('inspector-comment');
  await expect(comment).toContainText('Checked on site: matches the drawing.');
  // The day on Demo County's clock (America/Denver), named by its abbreviation (tz database: MST or MDT); a run
  // across midnight there may show either day.
  const shownDays = [Date.now() - 5 * 60_000, Date.now()].map((ms) => formatDate(ms, 'America/Denver'));
  expect(shownDays.some((d) => /^\w{3} \d{1,2}, \d{4}, M[SD]T$/.test(d))).toBe(true);
  await expect(comment).toContainText(new RegExp(shownDays.map((d) => d.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')).join('|')));
  await expect(comment).toContainText(/Inspector’s comment · \S+/);
  await expect(comment).toContainText(`report ${code}`);
  await finding.scrollIntoViewIfNeeded();
  await page.screenshot({ path: `${shots}/finding-comment.png`, fullPage: false });
  for (const size of [desktop, phone]) {
    await page.setViewportSize(size);
    await expectAxeClean(page, `check page @ ${size.width}`);
  }

  // The project page lists the outcome with the finding's title, linking to it.
  await page.setViewportSize(desktop);
  await page.goto(`/projects/${projectId}`);
  const line = page.getByTestId('outcome-finding-comment');
  await expect(line).toContainText(`${passed.title}: Checked on site: matches the drawing.`);
  await line.getByRole('link', { name: passed.title }).click();
  await expect(page).toHaveURL(new RegExp(`/checks/${checkId}#finding-`));
});

test('the inspections list searches and filters through the URL and stays usable at 390 px', async ({ browser }) => {
  test.setTimeout(240_000);
  const tag = `q${Date.now().toString(36)}`;
  const installerCtx = await browser.newContext();
  const installer = await installerCtx.newPage();
  await signInAs(installer, 'installer2@nookpass.demo');
  const { code, permit } = await sendReport(installer, tag);
  await installerCtx.close();

  const ctx = await browser.newContext({ viewport: phone });
  const insp = await ctx.newPage();
  await signInAs(insp, 'inspector@nookpass.demo');
  await insp.goto('/inspections');
  // A plain GET form: the filter is the URL, and the server does the searching.
  await expect(insp.getByRole('search')).toHaveAttribute('method', 'get');
  await insp.getByLabel('Search', { exact: true }).fill(permit.toLowerCase());
  await insp.getByRole('button', { name: 'Search', exact: true }).click();
  await expect(insp).toHaveURL(new RegExp(`[?&]q=${permit.toLowerCase()}`));
  const row = insp.getByTestId('inspection-row');
  await expect(row).toHaveCount(1);
  await expect(row).toHaveAttribute('data-code', code);
  await expect(row).toContainText(`7 ${tag} Way`);
  await expect(row).toContainText(`Permit ${permit}`);
  await expect(row).toContainText('Awaiting your outcome');
  await expect(insp.getByTestId('inspections-count')).toContainText('Reports 1–1 of 1');
  // At 390 px the table fits the screen: nothing to scroll sideways.
  const overflow = await insp.getByTestId('inspections-table').evaluate((t) => t.scrollWidth - (t.parentElement as HTMLElement).clientWidth);
  expect(overflow).toBeLessThanOrEqual(0);
  await insp.screenshot({ path: `${shots}/inspections-phone.png`, fullPage: true });

  // Outcome filter from the form: nothing approved with this permit yet.
  await insp.getByLabel('Outcome').selectOption('approved');
  await insp.getByRole('button', { name: 'Search', exact: true }).click();
  await expect(insp).toHaveURL(/outcome=approved/);
  await expect(insp.getByTestId('inspections-none')).toBeVisible();

  // A bad date names its field and the page still lists.
  await insp.goto(`/inspections?q=${tag}&from=2026-13-01`);
  await expect(insp.getByTestId('inspections-filter-errors')).toContainText('Received from: give a date as YYYY-MM-DD.');
  await expect(insp.getByLabel('Received from')).toHaveAttribute('aria-invalid', 'true');
  await expect(insp.getByTestId('inspection-row')).toHaveCount(1);
  await ctx.close();

  // Axe, with JavaScript, at desktop and phone width, on a filtered list.
  const axeCtx = await browser.newContext();
  const axePage = await axeCtx.newPage();
  await signInAs(axePage, 'inspector@nookpass.demo');
  await axePage.goto(`/inspections?q=${tag}&from=2026-13-01`);
  for (const size of [desktop, phone]) {
    await axePage.setViewportSize(size);
    await expectAxeClean(axePage, `inspections @ ${size.width}`);
  }
  await axeCtx.close();
});
