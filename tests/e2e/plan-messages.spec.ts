import AxeBuilder from '@axe-core/playwright';
import { expect, test } from '@playwright/test';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { signInAs } from './helpers';

test('the plan editor says what was typed and what is wanted, next to the field', async ({ page }) => {
  test.setTimeout(180_000);
  await signInAs(page, 'installer2@nookpass.demo');
  const project = await page.request.post('/api/projects', { data: { name: `E2E plan messages ${Date.now()} (test)`, siteAddress: '4 Message Street', jurisdiction: 'demo-county' } });
  expect(project.status()).toBe(201);
  const { id } = (await project.json()) as { id: string };
  expect((await page.request.post(`/api/projects/${id}/plans`, { data: { plan: hallClosetPassPlan } })).status()).toBe(201);

  await page.goto(`/projects/${id}/plan`);
  const flow = page.locator('#f-dryer-exhaustCfm');
  await flow.fill('lots');
  await flow.blur();
  await expect(page.locator('#f-dryer-exhaustCfm-error')).toHaveText('Exhaust rate: “lots” is not a number; enter cubic feet per minute, e.g. 150.');
  await expect(flow).toHaveAttribute('aria-describedby', /f-dryer-exhaustCfm-error/);

  // 6 ft 14 in is 86 in (6 × 12 + 14): refused, never read silently as 7' 2".
  const width = page.locator('#f-enclosure-width');
  await width.fill('6 ft 14');
  await width.blur();
  await expect(page.locator('#f-enclosure-width-error')).toContainText('inches after the feet must be under 12');
  await page.locator('#f-enclosure-width').locator('xpath=ancestor::div[1]').screenshot({ path: 'test-results/e2e/screens/plan-messages-feet-inches.png' });

  const axe = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa']).analyze();
  expect(axe.violations.map((v) => v.id)).toEqual([]);
});
