import { randomBytes } from 'node:crypto';
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page, type Route } from '@playwright/test';
import { signInAs } from './helpers';

// WCAG 2.2 level AA, as axe-core tags its rules.
const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
const shots = 'test-results/e2e/screens';
const PHONE = { width: 390, height: 844 };

async function expectAccessible(page: Page, at: string) {
  const { violations } = await new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
  expect(violations.map((v) => `${at}: ${v.id} ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)).toEqual([]);
}

/**
 * Holds the page's first progress question about a run until `release()`, so the progress bar stays on screen
 * while it is checked; the answers after it pass straight through.
 */
async function holdFirstPoll(page: Page, pattern: RegExp) {
  let release!: () => void;
  const released = new Promise<void>((resolve) => (release = resolve));
  let first = true;
  await page.route(pattern, async (route: Route) => {
    if (route.request().method() === 'GET' && first) {
      first = false;
      await released;
    }
    await route.continue();
  });
  return release;
}

async function expectProgressBar(page: Page, noun: 'projects' | 'plans') {
  const bar = page.getByRole('progressbar');
  await expect(bar).toBeVisible({ timeout: 30_000 });
  await expect(bar).toHaveAttribute('aria-valuetext', new RegExp(`^(Waiting for a worker…|\\d+ of \\d+ ${noun})$`));
  await expect(page.getByTestId('run-progress-text')).toHaveText(new RegExp(`^(Waiting for a worker…|\\d+ of \\d+ ${noun})$`));
  const now = await bar.getAttribute('aria-valuenow');
  if (now !== null) expect(Number(now)).toBeLessThanOrEqual(Number(await bar.getAttribute('aria-valuemax')));
}

test('the impact page runs the impact as a job: a progress bar while it works, then the result', async ({ page }) => {
  test.setTimeout(180_000);
  await signInAs(page, 'admin@nookpass.demo');
  const release = await holdFirstPoll(page, /\/api\/jurisdictions\/demo-county\/impact-runs\/[0-9a-f-]{36}$/);
  await page.goto('/rules/demo-county/impact');
  const panel = page.getByTestId('impact-run');
  await expect(panel).toBeVisible({ timeout: 60_000 });
  // A finished run of this version is shown as it is; "Run again" starts a new one. Otherwise the page starts one itself.
  await expect(panel.getByRole('progressbar').or(panel.getByRole('button', { name: 'Run again' }))).toBeVisible({ timeout: 30_000 });
  if (await panel.getByRole('button', { name: 'Run again' }).isVisible()) await panel.getByRole('button', { name: 'Run again' }).click();
  await expectProgressBar(page, 'projects');
  await expectAccessible(page, 'impact run under way');
  await page.screenshot({ path: `${shots}/admin-impact-run-progress.png`, fullPage: true });
  release();

  await expect(page.getByTestId('impact-run-finished')).toBeVisible({ timeout: 60_000 });
  // Demo County's zone is America/Denver (the demo seed): the time reads MST or MDT.
  await expect(page.getByTestId('impact-run-finished')).toContainText(/Result of the run finished .+ M[SD]T, over \d+ open projects?/);
  await expect(page.getByRole('progressbar')).toHaveCount(0);
  await expect(page.getByRole('heading', { name: /would now come out differently/ })).toBeVisible();
  await expect(page.getByRole('heading', { name: 'Other open projects' })).toBeVisible();
  await expectAccessible(page, 'impact result');
  await page.setViewportSize(PHONE);
  await expectAccessible(page, 'impact result, phone width');
});

test('a draft’s dry run runs as a job: started on opening the draft, progress, then the result for its revision', async ({ page }) => {
  test.setTimeout(180_000);
  await signInAs(page, 'admin@nookpass.demo');
  const slug = `e2e-runs-${randomBytes(3).toString('hex')}`;
  const made = await page.request.post('/api/jurisdictions', {
    data: {
      slug,
      name: 'Dry run as a job (test)',
      region: 'Test State (invented)',
      editions: { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' },
      inspectorEmail: '',
      amendmentNotes: 'Throwaway test jurisdiction.',
      startFrom: 'baseline',
      timeZone: 'America/Chicago',
    },
  });
  expect(made.status()).toBe(201);
  const release = await holdFirstPoll(page, /\/api\/rule-sets\/[0-9a-f-]{36}\/dry-runs\/[0-9a-f-]{36}$/);
  await page.goto(`/rules/${slug}/versions/1`);
  await expect(page.getByTestId('draft-revision')).toContainText('revision 1', { timeout: 60_000 });
  // No dry run of this revision yet: opening the draft starts one.
  await expectProgressBar(page, 'plans');
  await expectAccessible(page, 'dry run under way');
  release();

  await expect(page.getByTestId('dry-run-of')).toContainText(/Dry run of revision 1, finished .+ C[SD]T/, { timeout: 60_000 });
  await expect(page.getByTestId('dry-run-against')).toContainText('model-code baseline');
  await expect(page.getByTestId('dry-run-totals')).toContainText(/^0 of \d+ plans would change status/);
  await expect(page.getByRole('progressbar')).toHaveCount(0);

  // Opening the draft again shows the stored result at once; no new run starts.
  const starts: string[] = [];
  page.on('request', (r) => {
    if (r.method() === 'POST' && /\/dry-runs$/.test(r.url())) starts.push(r.url());
  });
  await page.reload();
  await expect(page.getByTestId('dry-run-of')).toContainText('Dry run of revision 1', { timeout: 60_000 });
  await expect(page.getByTestId('dry-run-stale')).toHaveCount(0);
  expect(starts).toEqual([]);

  // The button starts a new run; the page follows it to its result.
  await page.getByRole('button', { name: 'Dry-run this draft' }).click();
  await expect(page.getByTestId('dry-run-totals')).toBeVisible({ timeout: 60_000 });
  await expect(page.getByRole('button', { name: 'Dry-run this draft' })).toBeEnabled({ timeout: 60_000 });
  expect(starts).toHaveLength(1);
  await expectAccessible(page, 'dry run result');
  await page.setViewportSize(PHONE);
  await expectAccessible(page, 'dry run result, phone width');
  await page.screenshot({ path: `${shots}/admin-dry-run-job.png`, fullPage: true });
});
