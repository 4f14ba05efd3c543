import AxeBuilder from '@axe-core/playwright';
import { expect as baseExpect, test, type Page } from '@playwright/test';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { signInAs } from './helpers';

const shots = 'test-results/e2e/screens';
// Each step renders a page or issues a report (a PDF render); on a shared machine under the dev server that takes a while.
const expect = baseExpect.configure({ timeout: 60_000 });
// WCAG 2.2 level AA, as axe-core tags its rules.
const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

/** No WCAG 2.2 AA violation on the page as it stands, at desktop and at phone width. */
async function expectAccessible(page: Page, what: string) {
  const problems: string[] = [];
  for (const size of [{ width: 1280, height: 900 }, { width: 390, height: 844 }]) {
    await page.setViewportSize(size);
    const { violations } = await new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
    problems.push(...violations.map((v) => `${what} @ ${size.width}px: ${v.id} — ${v.help}`));
  }
  await page.setViewportSize({ width: 1280, height: 900 });
  expect(problems).toEqual([]);
}

test('an installer sends a report with a caution, the inspector asks for corrections, the installer answers with a new check, the inspector sees what changed and approves', async ({ page, browser }) => {
  test.setTimeout(600_000);
  await signInAs(page, 'installer2@nookpass.demo');
  // Our own project under a unique name, so other tests' projects and reports do not matter.
  const name = `E2E thread ${Date.now()} (test)`;
  const created = await page.request.post('/api/projects', { data: { name, siteAddress: '7 Thread Lane, Demo County (invented)', jurisdiction: 'demo-county' } });
  const projectId = ((await created.json()) as { id: string }).id;
  // Without water-hammer arrestors: one caution (the rule is common practice), nothing failing, so no send confirmation.
  const cautionPlan = { ...hallClosetPassPlan, plumbing: { ...hallClosetPassPlan.plumbing, hammerArrestors: false } };
  expect((await page.request.post(`/api/projects/${projectId}/plans`, { data: { plan: cautionPlan } })).status()).toBe(201);

  await page.goto('/projects');
  await page.getByLabel('Search projects').fill(name);
  await page.getByRole('link', { name }).click();
  await expect(page).toHaveURL(new RegExp(`/projects/${projectId}$`));
  await page.getByRole('button', { name: 'Run check' }).first().click();
  const arrestors = page.locator('[data-rule="plumbing.hammer-arrestors"]');
  await expect(arrestors).toHaveAttribute('data-status', 'caution');
  await expect(page.locator('[data-status="fail"]')).toHaveCount(0);

  await page.getByLabel(/Inspector.s e-mail/).fill('inspector@nookpass.demo');
  await page.getByLabel('Note (optional)').fill('Arrestors arrive next week.');
  await page.getByRole('button', { name: 'Send to inspector' }).click();
  await expect(page.getByTestId('send-result')).toContainText('in the inspector’s queue');
  const code = (await page.getByTestId('send-result').textContent())!.match(/NP(?:-[A-Z2-9]{4}){4}/)![0];

  // The inspector asks for corrections on the one finding.
  const ctx = await browser.newContext();
  const insp = await ctx.newPage();
  await signInAs(insp, 'inspector@nookpass.demo');
  await insp.goto('/inspections');
  await insp.getByRole('row', { name: new RegExp(code) }).getByRole('link').first().click();
  await expect(insp.getByRole('heading', { name })).toBeVisible();
  const inspectionUrl = insp.url();
  await insp.getByLabel('Corrections needed').check();
  await insp.getByLabel(/^Water-hammer arrestors/).fill('Fit arrestors at the washer valves before the final.');
  await insp.getByRole('button', { name: 'Record outcome' }).click();
  await expect(insp.getByText('Outcome recorded and the e-mail to the installer is queued.')).toBeVisible();

  // Reopened, the page shows what stands, and recording again is an explicit revision.
  await insp.goto(inspectionUrl);
  const standing = insp.getByTestId('standing-outcome');
  await expect(standing).toContainText('Corrections needed');
  await expect(standing).toContainText('Jordan Demo (inspector)');
  await expect(standing).toContainText('Fit arrestors at the washer valves');
  await expect(standing).toContainText('Arrestors arrive next week.');
  await expect(insp.getByRole('button', { name: 'Record outcome' })).toHaveCount(0);
  await insp.getByRole('button', { name: 'Revise outcome' }).click();
  await expect(insp.getByLabel('Corrections needed')).toBeChecked();
  await expect(insp.getByRole('button', { name: 'Save revised outcome' })).toBeVisible();
  await insp.getByRole('button', { name: 'Cancel' }).click();
  await expectAccessible(insp, 'inspection, corrections asked');

  // The installer corrects the plan, runs a new check and answers from the project page.
  await page.goto(`/projects/${projectId}/plan`);
  await page.locator('#f-plumbing-hammerArrestors').selectOption('yes');
  await page.getByRole('button', { name: 'Save plan' }).click();
  await expect(page.getByTestId('editor-status')).toContainText('Saved as revision 2');
  await page.getByRole('button', { name: 'Run check' }).click();
  await expect(page.locator('[data-rule="plumbing.hammer-arrestors"]')).toHaveAttribute('data-status', 'pass');
  await page.goto(`/projects/${projectId}`);
  const threads = page.getByTestId('inspection-outcomes');
  await expect(threads).toContainText('The inspector asked for corrections.');
  await page.getByLabel('Note to the inspector: what you corrected').fill('Arrestors fitted at both washer valves.');
  await page.getByRole('button', { name: 'Send answer' }).click();
  // The form's own "Answer sent" line goes with the form once the page refreshes to the new thread state, so the
  // thread itself is what shows the answer.
  await expect(threads).toContainText('Corrections answered with a new check');
  await expect(threads).toContainText('Waiting for the inspector’s outcome.');

  // The inspector sees what changed between the two checks and approves on the same page.
  await insp.goto(inspectionUrl);
  await expect(insp.getByTestId('under-review')).toContainText('answering check');
  const changes = insp.getByTestId('answer-changes');
  await expect(changes).toContainText('Water-hammer arrestors: Caution → Pass');
  // The plan value's label comes from the change summary's labels ("Plumbing hammer arrestors" today).
  await expect(changes).toContainText(/hammer arrestors: no → yes/i);
  await expect(insp.getByTestId('thread')).toContainText('Arrestors fitted at both washer valves.');
  await expectAccessible(insp, 'inspection, answer received');
  await insp.getByLabel('Approved').check();
  await insp.getByLabel('Comment to the installer').fill('Approved with the arrestors fitted.');
  await insp.getByRole('button', { name: 'Record outcome' }).click();
  await expect(insp.getByText('Outcome recorded and the e-mail to the installer is queued.')).toBeVisible();
  await expect(insp.getByTestId('standing-outcome')).toContainText('Approved');

  // Both sides read the whole thread, in order, with names.
  const order = ['sent', 'outcome', 'answer', 'outcome'];
  await expect(insp.getByTestId('thread').locator('li[data-testid^="thread-"]')).toHaveCount(order.length);
  for (const [i, kind] of order.entries()) await expect(insp.getByTestId('thread').locator('li[data-testid^="thread-"]').nth(i)).toHaveAttribute('data-testid', `thread-${kind}`);
  await insp.screenshot({ path: `${shots}/correction-thread-inspector.png`, fullPage: true });
  await ctx.close();

  await page.goto(`/projects/${projectId}`);
  const mine = page.getByTestId('inspection-outcomes');
  await expect(mine).toContainText('Approved by the inspector.');
  const items = mine.locator('li[data-testid^="thread-"]');
  await expect(items).toHaveCount(order.length);
  for (const [i, kind] of order.entries()) await expect(items.nth(i)).toHaveAttribute('data-testid', `thread-${kind}`);
  await expect(items.nth(0)).toContainText('Arrestors arrive next week.');
  await expect(items.nth(1)).toContainText('Jordan Demo (inspector)');
  await expect(items.nth(2)).toContainText('Sam Demo (installer)');
  await expect(items.nth(3)).toContainText('Approved with the arrestors fitted.');
  await expectAccessible(page, 'project with its thread');
  await page.screenshot({ path: `${shots}/correction-thread-installer.png`, fullPage: true });
});
