import { expect, test } from '@playwright/test';
import { MAX_DOORS, MAX_EXHAUST_RUN_PIECES, MAX_HINGES_PER_DOOR } from '@/lib/domain/plan';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { signInAs } from './helpers';

test('the plan editor offers no more route pieces or doors than a plan may hold, and names a hinge list over its limit', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'installer2@nookpass.demo');
  const project = await page.request.post('/api/projects', { data: { name: `E2E plan limits ${Date.now()} (test)`, siteAddress: '2 Limit Street', jurisdiction: 'demo-county' } });
  expect(project.status()).toBe(201);
  const { id } = (await project.json()) as { id: string };
  const plan = {
    ...hallClosetPassPlan,
    exhaust: { ...hallClosetPassPlan.exhaust, run: Array.from({ length: MAX_EXHAUST_RUN_PIECES - 1 }, () => ({ straight: 6 })) },
    doors: Array.from({ length: MAX_DOORS }, () => ({ ...hallClosetPassPlan.doors[0], width: '6-3/4' })),
  };
  expect((await page.request.post(`/api/projects/${id}/plans`, { data: { plan } })).status()).toBe(201);

  await page.goto(`/projects/${id}/plan`);
  await expect(page.locator('#f-exhaust-run-limit')).toHaveText(`${MAX_EXHAUST_RUN_PIECES - 1} of at most ${MAX_EXHAUST_RUN_PIECES} pieces in the route.`);
  await page.getByRole('button', { name: 'Add straight run' }).click();
  await expect(page.locator('#f-exhaust-run-limit')).toHaveText(`${MAX_EXHAUST_RUN_PIECES} of at most ${MAX_EXHAUST_RUN_PIECES} pieces in the route.`);
  for (const name of ['Add straight run', 'Add 90° elbow', 'Add 45° elbow']) await expect(page.getByRole('button', { name })).toBeDisabled();
  await expect(page.getByTestId('route-item')).toHaveCount(MAX_EXHAUST_RUN_PIECES);

  await expect(page.locator('#f-doors-limit')).toHaveText(`${MAX_DOORS} of at most ${MAX_DOORS} enclosure doors.`);
  await expect(page.getByRole('button', { name: 'Add door' })).toBeDisabled();

  // Thirteen positions typed into one door's hinge list: the field says what the limit is.
  const hinges = page.locator('#f-doors-0-hinges');
  await hinges.fill(Array.from({ length: MAX_HINGES_PER_DOOR + 1 }, (_, i) => 3 + i * 5).join(', '));
  await hinges.blur();
  await expect(page.locator('#f-doors-0-hinges-error')).toContainText(`at most ${MAX_HINGES_PER_DOOR} hinge positions on a door; this plan has ${MAX_HINGES_PER_DOOR + 1}.`);
  await page.locator('#f-doors li').first().screenshot({ path: 'test-results/e2e/screens/plan-limits-hinges.png' });
});
