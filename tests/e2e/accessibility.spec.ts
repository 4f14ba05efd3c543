import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { signInAs } from './helpers';

// WCAG 2.2 level AA, as axe-core tags its rules.
const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
const screens = [
  { name: 'desktop', width: 1280, height: 900 },
  { name: 'phone', width: 390, height: 844 },
];

async function analyze(page: Page) {
  try {
    return await new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
  } catch (err) {
    // A page that replaces itself once (a redirect after loading, the dev server's first compile) is checked as it settles.
    if (!/Execution context was destroyed/.test(String(err))) throw err;
    await page.waitForLoadState('networkidle');
    return new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
  }
}

/** Opens each page once and checks it at both widths; every violation is listed with its page and width. */
async function walk(page: Page, paths: string[]) {
  const problems: string[] = [];
  for (const path of paths) {
    await page.setViewportSize(screens[0]);
    const response = await page.goto(path);
    expect(response?.status(), path).toBeLessThan(500);
    await page.waitForLoadState('networkidle');
    await page.locator('main').first().waitFor();
    for (const screen of screens) {
      await page.setViewportSize(screen);
      const { violations } = await analyze(page);
      for (const v of violations) {
        problems.push(`${path} @ ${screen.name}: ${v.id} — ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
      }
    }
  }
  expect(problems).toEqual([]);
}

test('installer pages have no WCAG 2.2 AA violations at desktop and phone width', async ({ page }) => {
  test.setTimeout(240_000);
  await signInAs(page, 'installer2@nookpass.demo');
  const project = await page.request.post('/api/projects', { data: { name: `E2E accessibility ${Date.now()} (test)`, siteAddress: '5 Access Street', jurisdiction: 'demo-county' } });
  const projectId = ((await project.json()) as { id: string }).id;
  expect((await page.request.post(`/api/projects/${projectId}/plans`, { data: { plan: hallClosetPassPlan } })).status()).toBe(201);
  const check = await page.request.post(`/api/projects/${projectId}/checks`, { data: {} });
  const checkId = ((await check.json()) as { id: string }).id;
  const sent = await page.request.post(`/api/checks/${checkId}/send`, { data: { to: 'inspector@nookpass.demo', confirmFailingFindings: true } });
  expect(sent.status()).toBe(201);
  // The report reaches the inspector's queue, which the inspector's walk opens.

  await walk(page, [
    '/home',
    '/projects',
    '/projects/new',
    `/projects/${projectId}`,
    `/projects/${projectId}/plan`,
    `/projects/${projectId}/edit`,
    `/projects/${projectId}/drawing`,
    `/projects/${projectId}/checks/${checkId}`,
    '/appliances',
    '/quick-check',
    '/account',
  ]);
});

test('company owner pages have no WCAG 2.2 AA violations at desktop and phone width', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'installer@nookpass.demo');
  await walk(page, ['/company', '/people', '/audit']);
});

test('inspector pages have no WCAG 2.2 AA violations at desktop and phone width', async ({ page }) => {
  test.setTimeout(180_000);
  await signInAs(page, 'inspector@nookpass.demo');
  await page.goto('/inspections');
  const report = await page.locator('a[href^="/inspections/"]').first().getAttribute('href');
  expect(report).toBeTruthy();
  await walk(page, ['/inspections', report!, '/account']);
});

test('admin pages have no WCAG 2.2 AA violations at desktop and phone width', async ({ page }) => {
  test.setTimeout(300_000);
  await signInAs(page, 'admin@nookpass.demo');
  await page.goto('/projects');
  const project = await page.locator('a[href^="/projects/"]:not([href="/projects/new"])').first().getAttribute('href');
  expect(project).toMatch(/^\/projects\/[0-9a-f-]{36}$/);
  await walk(page, [
    '/home',
    '/jurisdictions',
    '/jurisdictions/new',
    '/jurisdictions/demo-county',
    '/rules',
    '/rules/demo-county',
    '/rules/demo-county/diff',
    '/rules/demo-county/impact',
    '/rules/demo-county/versions/1',
    '/users',
    '/projects',
    project!,
    `${project}/plan`,
    '/audit',
    '/account',
  ]);
});

test('pages without signing in have no WCAG 2.2 AA violations at desktop and phone width', async ({ page, browser }) => {
  test.setTimeout(120_000);
  // A report code from the inspector's queue, for the public verification page.
  const inspector = await browser.newContext();
  const insp = await inspector.newPage();
  await signInAs(insp, 'inspector@nookpass.demo');
  const queue = (await (await insp.request.get('/api/inspections')).json()) as { inspections: Array<{ code: string }> };
  const code = queue.inspections[0]?.code;
  await inspector.close();
  expect(code).toBeTruthy();
  // Unknown tokens: each page says the link does not work and what to do next.
  const unknown = 'A'.repeat(43);
  await walk(page, [
    '/', '/sign-in', '/sign-up', '/forgot-password', `/reset-password/${unknown}`, `/invitations/${unknown}`,
    `/confirm-email/${unknown}`, `/verify/${code}`, '/forbidden', '/no-such-page',
  ]);
});
