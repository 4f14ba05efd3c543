import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';

test('a quick check saved as a project keeps the plan as it is on screen, edits after the check included', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'installer@nookpass.demo');
  await page.goto('/quick-check');
  await page.locator('#qc-jurisdiction').selectOption('demo-county');
  await page.locator('#f-enclosure-depth').fill('30');
  await page.getByRole('button', { name: 'Check plan' }).click();
  await expect(page.getByTestId('quick-check-result')).toBeVisible();

  // One inch deeper after the check, then saved without checking again.
  await page.locator('#f-enclosure-depth').fill('31');
  const name = `E2E quick ${Date.now()}`;
  await page.locator('#qc-name').fill(name);
  await page.locator('#qc-siteAddress').fill('4 Quick Lane (demo)');
  await page.getByRole('button', { name: 'Save as project' }).click();
  await expect(page.getByRole('heading', { name })).toBeVisible();
  const id = new URL(page.url()).pathname.split('/')[2];
  const revision = await page.request.get(`/api/projects/${id}/plans/1`);
  expect(revision.status()).toBe(200);
  expect((await revision.json()).plan.enclosure.depth).toBe(31);

  // A field that does not parse keeps the project unsaved and says so.
  await page.goto('/quick-check');
  await page.locator('#qc-jurisdiction').selectOption('demo-county');
  await page.locator('#f-enclosure-depth').fill('30');
  await page.getByRole('button', { name: 'Check plan' }).click();
  await expect(page.getByTestId('quick-check-result')).toBeVisible();
  await page.locator('#f-enclosure-depth').fill('deep');
  await page.locator('#qc-name').fill(`${name} bad`);
  await page.locator('#qc-siteAddress').fill('4 Quick Lane (demo)');
  await page.getByRole('button', { name: 'Save as project' }).click();
  await expect(page.getByText('Not saved: fix the plan fields marked above first.')).toBeVisible();
  await expect(page).toHaveURL(/\/quick-check$/);
});
