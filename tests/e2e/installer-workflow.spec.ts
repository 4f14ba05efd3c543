import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';

const shots = 'test-results/e2e/screens';

test('an installer plans a closet, fails the exhaust length, drops a fitting and passes', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'installer2@nookpass.demo');

  // A new project for a new job.
  await page.getByRole('link', { name: 'New project' }).click();
  const name = `E2E hall closet ${Date.now()}`;
  await page.getByLabel('Project name').fill(name);
  await page.getByLabel('Site address').fill('1 Test Street, Demo County');
  await page.getByLabel('Jurisdiction (AHJ)').selectOption('demo-county');
  await page.getByRole('button', { name: 'Create project' }).click();
  await expect(page.getByRole('heading', { name })).toBeVisible();

  await page.getByRole('link', { name: 'Plan', exact: true }).click();
  await expect(page.getByText('Not saved yet')).toBeVisible();

  // Mixed units: feet-inches, fractions and millimetres in one plan; the other system shows beside each field.
  await page.locator('#f-enclosure-width').fill(`4' 6"`);
  await expect(page.getByTestId('convert-enclosure.width')).toHaveText(`= 4' 6" · 1371.6 mm`); // 54 in × 25.4 = 1371.6 mm (NIST SP 811)
  await page.locator('#f-enclosure-depth').fill('762 mm');
  await expect(page.getByTestId('convert-enclosure.depth')).toContainText(`2' 6"`); // 762 mm / 25.4 = 30 in
  await page.locator('#f-enclosure-height').fill('84');
  await page.locator('#f-enclosure-panelThickness').fill('3/4');
  await page.locator('#f-dryer-fuel').selectOption('electric');
  await page.locator('#f-exhaust-material').selectOption('rigid-metal');
  await page.locator('#f-exhaust-diameter').fill('4 in');

  // Route: 28 ft of straight duct and two 4-in-radius mitered 90° elbows.
  // IRC 2018 Table M1502.4.5.1: each counts 5 ft, so 28 + 10 = 38 ft, over the 35 ft of M1502.4.5.1.
  await page.getByRole('button', { name: 'Add straight run' }).click();
  await page.locator('#f-exhaust-run-0-straight').fill('20 ft');
  await page.getByRole('button', { name: 'Add 90° elbow' }).click();
  await page.getByRole('button', { name: 'Add straight run' }).click();
  await page.locator('#f-exhaust-run-2-straight').fill(`8'`);
  await page.getByRole('button', { name: 'Add 90° elbow' }).click();
  await expect(page.getByTestId('developed-length')).toHaveText(`38' 0"`);
  await expect(page.getByTestId('allowed-length')).toHaveText(`35' 0"`);
  await expect(page.getByTestId('route-verdict')).toHaveText(`3' 0" too long`);

  await page.getByRole('button', { name: 'Save plan' }).click();
  await expect(page.getByTestId('editor-status')).toContainText('Saved as revision 1');
  await page.screenshot({ path: `${shots}/plan-editor.png`, fullPage: true });

  const t0 = Date.now();
  await page.getByRole('button', { name: 'Run check' }).click();
  const developed = page.locator('[data-rule="exhaust.developed-length"]');
  await expect(developed).toBeVisible();
  console.log(`[measure] Run check → findings visible: ${Date.now() - t0} ms`);
  await expect(developed).toHaveAttribute('data-status', 'fail');
  const firstCheckUrl = page.url();
  await expect(developed.getByTestId('citation')).toHaveText('IRC 2018 M1502.4.5.1');
  await expect(developed.getByTestId('measured')).toHaveText(`38' 0"`);
  await expect(developed.getByTestId('limit')).toHaveText(`35' 0"`);
  await expect(developed.getByTestId('remedy')).toContainText(/mitered 90° elbow/);
  await expect(page.getByRole('note', { name: 'Safety and authority notice' })).toBeVisible();
  await page.screenshot({ path: `${shots}/check-fail.png`, fullPage: true });

  // Drop one elbow: 33 ft developed, within 35 ft.
  await page.getByRole('link', { name: 'Edit plan' }).click();
  await expect(page.getByTestId('route-item')).toHaveCount(4);
  await page.getByRole('button', { name: 'Remove piece 4' }).click();
  await expect(page.getByTestId('developed-length')).toHaveText(`33' 0"`);
  await page.getByRole('button', { name: 'Save plan' }).click();
  await expect(page.getByTestId('editor-status')).toContainText('Saved as revision 2');
  await page.getByRole('button', { name: 'Run check' }).click();
  await page.waitForURL((url) => /\/checks\/[0-9a-f-]{36}$/.test(url.pathname) && url.href !== firstCheckUrl);
  await page.getByText('All findings').click();
  await expect(page.locator('[data-rule="exhaust.developed-length"]')).toHaveAttribute('data-status', 'pass');
  await expect(page.getByTestId('changes-since')).toContainText('Fails → Pass');
  await page.screenshot({ path: `${shots}/check-pass.png`, fullPage: true });

  // The drawing of the saved plan, with the exhaust schematic at the new total.
  await page.getByRole('link', { name: 'Drawing' }).first().click();
  await expect(page.getByText('Front elevation').first()).toBeVisible();
  await page.screenshot({ path: `${shots}/drawing.png`, fullPage: true });

  // The history keeps both checks and both revisions.
  await page.getByRole('link', { name: 'Overview' }).click();
  await expect(page.getByRole('table', { name: 'Check history' }).locator('tbody tr')).toHaveCount(2);
  await expect(page.getByTestId('revisions').locator('li')).toHaveCount(2);
});

test('a bad length names the field and keeps what was typed', async ({ page }) => {
  await signInAs(page, 'installer2@nookpass.demo');
  await page.goto('/projects');
  await page.getByLabel('Search projects').fill('hall closet pair');
  await page.getByRole('link', { name: /Demo — hall closet pair/ }).click();
  await page.getByRole('link', { name: 'Plan', exact: true }).click();
  await page.locator('#f-enclosure-width').fill('thirty furlongs');
  await page.getByRole('button', { name: 'Save plan' }).click();
  await expect(page.getByTestId('error-summary')).toContainText('Enclosure width');
  await expect(page.locator('#f-enclosure-width-error')).toContainText("'thirty furlongs' is not a length");
  await expect(page.locator('#f-enclosure-width')).toHaveValue('thirty furlongs');
  await expect(page.getByTestId('editor-state')).toHaveText('Unsaved changes');
});
