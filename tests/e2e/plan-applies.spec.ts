import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';

const shots = 'test-results/e2e/screens';

test('the gas-location questions appear only for a gas dryer, and a dedicated closet off a bedroom passes', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'installer2@nookpass.demo');
  await page.getByRole('link', { name: 'New project' }).click();
  const name = `E2E gas closet ${Date.now()}`;
  await page.getByLabel('Project name').fill(name);
  await page.getByLabel('Site address').fill('2 Test Street, Demo County');
  await page.getByLabel('Jurisdiction (AHJ)').selectOption('demo-county');
  await page.getByRole('button', { name: 'Create project' }).click();
  await expect(page.getByRole('heading', { name })).toBeVisible();
  await page.getByRole('link', { name: 'Plan', exact: true }).click();

  await expect(page.locator('#f-space-buildingType')).toBeVisible();
  await expect(page.locator('#f-space-door-solid')).toHaveCount(0);
  await expect(page.locator('#f-gas-combustionAirFromOutdoors')).toHaveCount(0);

  await page.locator('#f-space-kind').selectOption('reach-in-closet');
  await page.locator('#f-space-opensInto').selectOption('bedroom');
  await page.locator('#f-dryer-fuel').selectOption('gas');
  for (const id of ['space-dedicatedToLaundry', 'space-door-solid', 'space-door-weatherStripped', 'space-door-selfClosing', 'gas-combustionAirFromOutdoors']) {
    await page.locator(`#f-${id}`).selectOption('yes');
  }
  await page.screenshot({ path: `${shots}/plan-editor-gas-location.png`, fullPage: true });

  // Electric: the questions go away and are not saved; gas again: the answers are still there.
  await page.locator('#f-dryer-fuel').selectOption('electric');
  await expect(page.locator('#f-space-door-solid')).toHaveCount(0);
  await page.locator('#f-dryer-fuel').selectOption('gas');
  await expect(page.locator('#f-space-door-solid')).toHaveValue('yes');

  await page.getByRole('button', { name: 'Save plan' }).click();
  await expect(page.getByTestId('editor-status')).toContainText('Saved as revision 1');
  await page.getByRole('button', { name: 'Run check' }).click();
  const location = page.locator('[data-rule="gas.location"]');
  await expect(location).toBeVisible();
  // IRC G2406.2 exception: used for nothing else, solid weather-stripped self-closing door, outdoor combustion air.
  await expect(location).toHaveAttribute('data-status', 'pass');
  await expect(location.getByTestId('citation')).toHaveText('IRC 2018 G2406.2');
});
