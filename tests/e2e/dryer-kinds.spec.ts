import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';

test('the plan editor asks a ventless dryer for its condensate, not an exhaust route; a hard-wired dryer for its disconnect', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'installer2@nookpass.demo');
  await page.getByRole('link', { name: 'New project' }).click();
  const name = `E2E ventless closet ${Date.now()}`;
  await page.getByLabel('Project name').fill(name);
  await page.getByLabel('Site address').fill('2 Test Street, Demo County');
  await page.getByLabel('Jurisdiction (AHJ)').selectOption('demo-county');
  await page.getByRole('button', { name: 'Create project' }).click();
  await expect(page.getByRole('heading', { name })).toBeVisible();
  await page.getByRole('link', { name: 'Plan', exact: true }).click();

  // A dryer whose type is not given is vented: the exhaust section and its route builder are there.
  await expect(page.locator('#section-exhaust')).toBeVisible();
  await expect(page.getByRole('button', { name: 'Add straight run' })).toBeVisible();
  await expect(page.locator('#f-dryer-condensate')).toHaveCount(0);

  // IRC M1502.2 exception: a listed heat-pump (condensing) dryer needs no exhaust duct.
  await page.locator('#f-dryer-type').selectOption('heat-pump');
  await expect(page.locator('#section-exhaust')).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'Add straight run' })).toHaveCount(0);
  await expect(page.locator('#f-dryer-maxDuctLength')).toHaveCount(0);
  await page.locator('#f-dryer-condensate').selectOption('drain');
  await page.locator('#f-dryer-condensateDrainTo').selectOption('standpipe');
  await expect(page.locator('#f-dryer-condensateDrainReachable')).toBeVisible();

  // A dryer receptacle entry may be hard-wired: it is then asked for a disconnect, not plug reach.
  await page.getByRole('button', { name: /Add receptacle/ }).click();
  await page.locator('#f-electrical-receptacles-0-serves').selectOption('dryer');
  await expect(page.locator('#f-electrical-receptacles-0-reachableInstalled')).toBeVisible();
  await page.locator('#f-electrical-receptacles-0-hardWired').selectOption('yes');
  await expect(page.locator('#f-electrical-receptacles-0-disconnect')).toBeVisible();
  await expect(page.locator('#f-electrical-receptacles-0-reachableInstalled')).toHaveCount(0);

  await page.getByRole('button', { name: 'Save plan' }).click();
  await expect(page.getByTestId('editor-status')).toContainText('Saved as revision 1');
  await page.screenshot({ path: 'test-results/e2e/screens/plan-editor-ventless.png', fullPage: true });
});
