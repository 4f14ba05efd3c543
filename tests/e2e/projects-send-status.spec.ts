import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { hallClosetPassPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';
import { signInAs } from './helpers';

/*
 * The installer's view of where a job stands (the projects list: check counts and the inspector's
 * outcome apart) and what the send form says before a report goes out.
 */

// WCAG 2.2 level AA, as axe-core tags its rules.
const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
const tag = () => Math.random().toString(36).slice(2, 8);

// Two inches less enclosure depth than the passing hall closet leaves the rear zone short: a caution, nothing failing.
const cautionPlan = { ...hallClosetPassPlan, enclosure: { ...hallClosetPassPlan.enclosure, depth: 34 } };

async function newProjectWithCheck(page: Page, name: string, jurisdiction: string, plan: object) {
  const p = await page.request.post('/api/projects', { data: { name, siteAddress: '12 Status Street', jurisdiction } });
  expect(p.status()).toBe(201);
  const project = await p.json();
  expect((await page.request.post(`/api/projects/${project.id}/plans`, { data: { plan } })).status()).toBe(201);
  const check = await page.request.post(`/api/projects/${project.id}/checks`, { data: {} });
  expect(check.status()).toBe(201);
  return { projectId: project.id as string, check: (await check.json()) as { id: string; summary: { fail: number; needsInfo: number; caution: number; pass: number } } };
}

test('projects list shows the check counts and the inspector asking for corrections, at desktop and phone width, axe clean', async ({ page, browser }) => {
  test.setTimeout(180_000);
  await signInAs(page, 'installer@nookpass.demo');
  const name = `Status columns ${tag()} (e2e)`;
  const { check } = await newProjectWithCheck(page, name, 'demo-county', cautionPlan);
  expect(check.summary).toMatchObject({ fail: 0, needsInfo: 0 });
  expect(check.summary.caution).toBeGreaterThan(0);
  const sent = await page.request.post(`/api/checks/${check.id}/send`, { data: {} });
  expect(sent.status()).toBe(201);
  const code = (await sent.json()).report.code as string;

  const ictx = await browser.newContext();
  const insp = await ictx.newPage();
  await signInAs(insp, 'inspector@nookpass.demo');
  const queue = await (await insp.request.get('/api/inspections')).json();
  const reportId = queue.inspections.find((i: { code: string }) => i.code === code).reportId;
  const review = await insp.request.post(`/api/inspections/${reportId}/review`, { data: { outcome: 'corrections-needed', comment: 'Label the duct length.' } });
  expect(review.ok()).toBe(true);
  await ictx.close();

  const s = check.summary;
  const counts = `${s.fail} fail · ${s.needsInfo} need information · ${s.caution} caution · ${s.pass} pass`;
  for (const width of [1280, 390]) {
    await page.setViewportSize({ width, height: 900 });
    await page.goto('/projects');
    await page.getByLabel('Search projects').fill(name);
    const row = page.getByRole('row', { name: new RegExp(name.replace(/[()]/g, '\\$&')) });
    await expect(row).toHaveCount(1);
    // Not a plain green "Passes": the cautions are said, and the inspector's outcome has its own place.
    await expect(row.getByText('Passes, with cautions').filter({ visible: true })).toBeVisible();
    await expect(row.getByText(counts).filter({ visible: true })).toBeVisible();
    await expect(row.getByText('Inspector asked for corrections').filter({ visible: true })).toBeVisible();
    await expect(row.getByText(`Report ${code}`).filter({ visible: true })).toBeVisible();
    await expect(row.getByText('Passes', { exact: true })).toHaveCount(0);
    if (width === 390) {
      // The columns fold under the name; nothing makes the page scroll sideways.
      await expect(row.getByTestId('project-row-narrow')).toBeVisible();
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    }
    const axe = await new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
    expect(axe.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`), `axe at ${width} px`).toEqual([]);
  }
});

test('the send form asks before sending failing findings and says when the address is not the inspector’s', async ({ page }) => {
  test.setTimeout(180_000);
  await signInAs(page, 'installer@nookpass.demo');
  const { projectId, check } = await newProjectWithCheck(page, `Failing send ${tag()} (e2e)`, 'demo-county', longExhaustFailPlan);
  const failing = check.summary.fail;
  expect(failing).toBeGreaterThan(0);
  await page.goto(`/projects/${projectId}/checks/${check.id}`);
  await expect(page.getByTestId('send-failing-note')).toContainText(`${failing} failing finding`);

  // Another address: said while typing, before anything is sent.
  await page.getByLabel(/Inspector.s e-mail/).fill('someone-else@example.test');
  await expect(page.getByTestId('send-to-other')).toContainText('is not Demo County’s inspector address (inspector@nookpass.demo)');
  await page.getByLabel(/Inspector.s e-mail/).fill('inspector@nookpass.demo');
  await expect(page.getByTestId('send-to-other')).toHaveText('');

  // The send button stays busy while the request runs.
  let release!: () => void;
  const held = new Promise<void>((r) => (release = r));
  await page.route(`**/api/checks/${check.id}/send`, async (route) => {
    await held;
    await route.continue();
  });
  await page.getByRole('button', { name: 'Send to inspector' }).click();
  const busy = page.getByTestId('send-report');
  await expect(busy).toHaveText('Sending…');
  await expect(busy).toBeDisabled();
  await expect(busy).toHaveAttribute('aria-busy', 'true');
  release();

  const ask = page.getByTestId('send-confirm-failing');
  await expect(ask).toContainText(`Send a report with ${failing} failing finding`);
  await page.getByRole('button', { name: 'Cancel' }).click();
  await expect(ask).toHaveCount(0);
  await expect(page.getByTestId('send-result')).toHaveCount(0);

  await page.getByRole('button', { name: 'Send to inspector' }).click();
  await page.getByRole('button', { name: 'Send with failing findings' }).click();
  await expect(page.getByTestId('send-result')).toContainText('sent to inspector@nookpass.demo');
  const axe = await new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
  expect(axe.violations.map((v) => v.id)).toEqual([]);
});

test('a jurisdiction nobody inspects in NookPass, or without an inspector address, says so before the send', async ({ page, browser }) => {
  test.setTimeout(150_000);
  await signInAs(page, 'installer@nookpass.demo');
  const { projectId, check } = await newProjectWithCheck(page, `City send ${tag()} (e2e)`, 'demo-city', hallClosetPassPlan);
  await page.goto(`/projects/${projectId}/checks/${check.id}`);
  await expect(page.getByTestId('no-inspector-account')).toContainText('Demo City has no inspector working in NookPass yet');
  await expect(page.getByLabel(/Inspector.s e-mail/)).toHaveAttribute('aria-describedby', /send-no-inspector/);

  // Without an address on file: said before anything is typed, and the button does not promise an inspector.
  const actx = await browser.newContext();
  const admin = await actx.newPage();
  await signInAs(admin, 'admin@nookpass.demo');
  const before = (await (await admin.request.get('/api/jurisdictions/demo-city')).json()).inspectorEmail as string | null;
  try {
    expect((await admin.request.patch('/api/jurisdictions/demo-city', { data: { inspectorEmail: '' } })).status()).toBe(200);
    await page.reload();
    await expect(page.getByTestId('no-inspector-address')).toContainText('Demo City has no inspector address on file');
    await expect(page.getByTestId('no-inspector-address')).toContainText('will not reach an inspector’s queue');
    await expect(page.getByLabel(/Inspector.s e-mail/)).toHaveValue('');
    await expect(page.getByRole('button', { name: 'Send by e-mail' })).toBeVisible();
  } finally {
    expect((await admin.request.patch('/api/jurisdictions/demo-city', { data: { inspectorEmail: before ?? '' } })).status()).toBe(200);
    await actx.close();
  }
});

test('Create project stays busy until the new project opens, and one press makes one project', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'installer@nookpass.demo');
  await page.goto('/projects/new');
  const name = `Busy create ${tag()} (e2e)`;
  await page.getByLabel('Project name').fill(name);
  await page.getByLabel('Site address').fill('5 Patience Row');
  await page.getByLabel('Jurisdiction (AHJ)').selectOption('demo-county');
  // Hold the new project's page back so the moment between the save and the page is long enough to see.
  let release!: () => void;
  const held = new Promise<void>((r) => (release = r));
  await page.route(/\/projects\/[0-9a-f-]{36}(\?.*)?$/, async (route) => {
    await held;
    await route.continue();
  });
  const created = page.waitForResponse((r) => r.url().endsWith('/api/projects') && r.request().method() === 'POST');
  await page.getByRole('button', { name: 'Create project' }).click();
  expect((await created).status()).toBe(201);
  const button = page.getByTestId('project-submit');
  await expect(button).toHaveText('Creating…');
  await expect(button).toBeDisabled();
  await button.click({ force: true });
  release();
  await expect(page).toHaveURL(/\/projects\/[0-9a-f-]{36}$/);
  const list = await (await page.request.get(`/api/projects?q=${encodeURIComponent(name)}`)).json();
  expect(list.total).toBe(1);
});
