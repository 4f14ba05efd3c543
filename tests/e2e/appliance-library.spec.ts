import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';

test('an installer picks a demo washer and dryer from the library, edits a figure and saves the plan', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'installer2@nookpass.demo');

  // The library page lists the demo catalog and documents the CSV header.
  await page.getByRole('link', { name: 'Appliance library' }).click();
  await expect(page.getByTestId('appliance-table')).toContainText('Demo FL-27 front-load washer (demo)');
  await expect(page.getByTestId('csv-header')).toContainText('kind,label,width_in,depth_in,height_in');

  await page.getByRole('link', { name: 'Projects' }).click();
  await page.getByRole('link', { name: 'New project' }).click();
  const name = `E2E library closet ${Date.now()}`;
  await page.getByLabel('Project name').fill(name);
  await page.getByLabel('Site address').fill('2 Library Street, Demo County');
  await page.getByLabel('Jurisdiction (AHJ)').selectOption('demo-county');
  await page.getByRole('button', { name: 'Create project' }).click();
  await expect(page.getByRole('heading', { name })).toBeVisible();
  const projectId = new URL(page.url()).pathname.split('/')[2];
  await page.getByRole('link', { name: 'Plan', exact: true }).click();

  // The demo washer: 27 × 32 × 39 in, 4 in behind (invented demo figures, db/demo-appliances.ts).
  const washerPicker = page.getByTestId('library-picker-washer');
  await washerPicker.getByLabel('Fill from the appliance library').selectOption({ label: 'Demo FL-27 front-load washer (demo) (washer)' });
  await washerPicker.getByRole('button', { name: 'Fill washer fields' }).click();
  await expect(page.locator('#f-washer-width')).toHaveValue('27');
  await expect(page.locator('#f-washer-depth')).toHaveValue('32');
  await expect(page.locator('#f-washer-clearances-rear')).toHaveValue('4');
  await expect(page.locator('#f-washer-model-label')).toHaveValue('Demo FL-27 front-load washer (demo)');

  const dryerPicker = page.getByTestId('library-picker-dryer');
  await dryerPicker.getByLabel('Fill from the appliance library').selectOption({ label: 'Demo ED-27 electric dryer (demo) (dryer)' });
  await dryerPicker.getByRole('button', { name: 'Fill dryer fields' }).click();
  await expect(page.locator('#f-dryer-fuel')).toHaveValue('electric');
  await expect(page.locator('#f-dryer-exhaustCfm')).toHaveValue('180');
  await expect(page.locator('#f-dryer-maxDuctLength')).toHaveValue('420');
  await expect(page.locator('#f-dryer-closetVent-top')).toHaveValue('48');

  // Filled values stay editable: this closet's dryer sits on a 1-in riser.
  await page.locator('#f-dryer-height').fill('40');

  await page.getByRole('button', { name: 'Save plan' }).click();
  await expect(page.getByTestId('editor-status')).toContainText('Saved as revision 1');

  const saved = await page.request.get(`/api/projects/${projectId}/plans/1`);
  expect(saved.status()).toBe(200);
  const { plan } = await saved.json();
  expect(plan.washer).toMatchObject({ width: 27, depth: 32, height: 39, clearances: { rear: 4 }, model: { label: 'Demo FL-27 front-load washer (demo)' } });
  expect(plan.dryer).toMatchObject({ fuel: 'electric', height: 40, exhaustCfm: 180, maxDuctLength: 420, closetVent: { top: 48, bottom: 24 }, model: { label: 'Demo ED-27 electric dryer (demo)' } });
  expect(plan.washer.model.id).toMatch(/^[0-9a-f-]{36}$/);
});
