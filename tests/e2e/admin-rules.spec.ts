import { expect, test, type Page } from '@playwright/test';
import { signInAs } from './helpers';

const shots = 'test-results/e2e/screens';
const PROJECT = 'Demo — second company hall closet, 300 Fictional Ave';
// The hall-closet plan develops 24 in + 5 ft (4-in-radius mitered 90°) + 12 ft + 1 ft 9 in
// (6-in-radius smooth 90°) + 1 ft 6 in = 22 ft 3 in (IRC Table M1502.4.6.1), within the 35 ft of
// IRC 2021 M1502.4.6.1; the invented local amendment of 20 ft = 240 in puts it over.
const LOCAL_MAX_IN = '240';
const NOTE = 'Local amendment DC-M1502 (demo): maximum developed length of a dryer exhaust duct lowered to 20 ft.';

async function openProject(page: Page) {
  await page.goto('/projects');
  await page.getByLabel('Search projects').fill('300 Fictional Ave');
  await page.getByRole('link', { name: PROJECT }).click();
  await expect(page.getByRole('heading', { name: PROJECT })).toBeVisible();
}

test('an admin amends the maximum developed length for Demo City, dry-runs, publishes, and the installer re-runs', async ({ browser }) => {
  test.setTimeout(180_000);
  const installerContext = await browser.newContext();
  const installer = await installerContext.newPage();
  const adminContext = await browser.newContext();
  const admin = await adminContext.newPage();

  // The installer's latest check ran on the published version and passes the length rule.
  await signInAs(installer, 'other-installer@nookpass.demo');
  await openProject(installer);
  await installer.getByRole('button', { name: /^(Run check|Re-run against version \d+)$/ }).first().click();
  await expect(installer.getByTestId('check-meta')).toBeVisible();
  const before = Number((await installer.getByTestId('check-meta').textContent())!.match(/rule set version (\d+)/)![1]);
  await installer.getByText('All findings').click();
  await expect(installer.locator('[data-rule="exhaust.developed-length"]')).toHaveAttribute('data-status', 'pass');

  // Admin pages are for admins only.
  await installer.goto('/rules');
  await expect(installer).toHaveURL(/\/forbidden/);

  // The admin starts a draft from Demo City's published version.
  await signInAs(admin, 'admin@nookpass.demo');
  await admin.getByRole('link', { name: 'Rules', exact: true }).click();
  await admin.getByRole('link', { name: 'Demo City', exact: true }).click();
  await admin.getByRole('button', { name: 'Start a draft from the published version' }).click();
  await expect(admin.getByRole('heading', { name: `Rule set version ${before + 1}` })).toBeVisible();
  await expect(admin.getByTestId('draft-revision')).toContainText('revision 1');
  const draftUrl = admin.url();

  // Another admin tab holds the same draft at revision 1.
  const second = await adminContext.newPage();
  await second.goto(draftUrl);
  await expect(second.getByTestId('draft-revision')).toContainText('revision 1');

  // The local amendment, in the form generated from the parameters schema.
  const maxLength = admin.locator('#p-exhaust-maxDevelopedLengthIn');
  await expect(maxLength).toHaveValue('420'); // 35 ft, IRC 2021 M1502.4.6.1
  await maxLength.fill(LOCAL_MAX_IN);
  await expect(admin.getByTestId('hint-exhaust.maxDevelopedLengthIn')).toHaveText(`= 20' 0"`);
  // A value changed from the model code needs the local amendment's citation: refused without it, naming the field.
  await admin.getByRole('button', { name: 'Save parameters' }).click();
  await expect(admin.locator('#p-exhaust-maxDevelopedLengthIn-error')).toContainText('Cite the local amendment');
  await expect(admin.getByTestId('draft-revision')).toContainText('revision 1');
  await admin.getByLabel(/Changed from the model value 35' 0"/).fill('DC-M1502 (demo)');
  await admin.getByRole('button', { name: 'Save parameters' }).click();
  await expect(admin.getByTestId('parameters-status')).toHaveText('Parameters saved to the draft.');
  await expect(admin.getByTestId('draft-revision')).toContainText('revision 2');

  // The other tab's save from revision 1 is refused with a clear message; what it typed stays.
  await second.locator('#p-exhaust-transitionMaxLengthIn').fill('90');
  await second.locator('#p-exhaust-transitionMaxLengthIn-amendment').fill('DC-M1502.4.3 (demo)');
  await second.getByRole('button', { name: 'Save parameters' }).click();
  await expect(second.getByTestId('conflict')).toContainText('after you loaded revision 1');
  await expect(second.locator('#p-exhaust-transitionMaxLengthIn')).toHaveValue('90');
  await second.close();

  // A bad value names its field and saves nothing.
  await maxLength.fill('-5');
  await admin.getByRole('button', { name: 'Save parameters' }).click();
  await expect(admin.locator('#p-exhaust-maxDevelopedLengthIn-error')).toBeVisible();
  await expect(admin.getByTestId('draft-revision')).toContainText('revision 2');
  await maxLength.fill(LOCAL_MAX_IN);

  // Dry run: the installer's project flips to fail on the length rule.
  await admin.getByRole('button', { name: 'Dry-run this draft' }).click();
  const row = admin.locator(`[data-subject="${PROJECT}"]`);
  await expect(row).toHaveAttribute('data-changed', 'true', { timeout: 60_000 });
  const change = row.locator('[data-change="exhaust.developed-length"]');
  await expect(change).toHaveAttribute('data-from', 'pass');
  await expect(change).toHaveAttribute('data-to', 'fail');
  await expect(change).toContainText(`limit 35' 0" → 20' 0"`);
  await expect(row.getByTestId('outcome-after')).toHaveText('fails');
  await admin.screenshot({ path: `${shots}/admin-dry-run.png`, fullPage: true });

  // Publish with a changelog note; the impact page lists the project.
  await admin.getByLabel('Changelog note (shown to installers)').fill(NOTE);
  await admin.getByRole('button', { name: `Publish version ${before + 1}` }).click();
  // Demo City's from-memory citations are not checked against the adopted text: the admin confirms.
  await expect(admin.getByTestId('publish-confirm')).toBeVisible();
  await admin.getByRole('button', { name: 'Publish with them unchecked' }).click();
  await expect(admin.getByTestId('published-notice')).toContainText(`Version ${before + 1} is published`);
  // The impact is worked out by a job: the page shows its progress, then the result.
  await expect(admin.getByTestId('impact-changing').locator(`[data-project="${PROJECT}"]`)).toContainText('Exhaust duct developed length', { timeout: 60_000 });
  await admin.screenshot({ path: `${shots}/admin-impact.png`, fullPage: true });

  // The published version shows read-only, and the diff shows the amendment.
  await admin.goto(draftUrl);
  await expect(admin.locator('[data-version-status="published"]')).toBeVisible();
  await expect(admin.locator('#p-exhaust-maxDevelopedLengthIn')).toBeDisabled();
  await admin.getByRole('link', { name: /All versions/ }).click();
  await admin.getByRole('button', { name: 'Show differences' }).click();
  const diffRow = admin.locator('[data-diff-path="exhaust.maxDevelopedLengthIn"]');
  await expect(diffRow.locator('[data-side="from"]')).toHaveText(`35' 0"`);
  await expect(diffRow.locator('[data-side="to"]')).toHaveText(`20' 0"`);

  // The installer sees newer rules, re-runs, and gets the new version, its note and the new limit.
  await openProject(installer);
  await expect(installer.getByTestId('newer-rules')).toContainText(`version ${before + 1}`);
  await expect(installer.getByTestId('newer-rules')).toContainText(NOTE);
  await installer.getByRole('button', { name: `Re-run against version ${before + 1}` }).click();
  await expect(installer.getByTestId('check-meta')).toContainText(`rule set version ${before + 1}`);
  const length = installer.locator('[data-rule="exhaust.developed-length"]');
  await expect(length).toHaveAttribute('data-status', 'fail');
  await expect(length.getByTestId('citation')).toHaveText('IRC 2021 M1502.4.6.1');
  await expect(length.getByTestId('measured')).toHaveText(`22' 3"`);
  await expect(length.getByTestId('limit')).toHaveText(`20' 0"`);
  await expect(installer.getByRole('note', { name: 'Safety and authority notice' })).toBeVisible();
  await installer.screenshot({ path: `${shots}/installer-rerun.png`, fullPage: true });

  // Put Demo City's limit back for the specs that follow (a new version; history stays).
  const start = await admin.request.post('/api/jurisdictions/demo-city/rule-sets', { data: { from: 'published' } });
  expect(start.status()).toBe(201);
  const draft = await start.json();
  const set = await (await admin.request.get(`/api/rule-sets/${draft.id}`)).json();
  const saved = await admin.request.patch(`/api/rule-sets/${draft.id}`, {
    data: { revision: set.revision, parameters: { ...set.parameters, exhaust: { ...set.parameters.exhaust, maxDevelopedLengthIn: 420 }, amendments: [] } },
  });
  expect(saved.status()).toBe(200);
  const restored = await admin.request.post(`/api/rule-sets/${draft.id}/publish`, {
    data: { revision: (await saved.json()).revision, changelog: 'Demo: the 35 ft model-code maximum developed length again (end of the administration walkthrough).', confirm: true },
  });
  expect(restored.status()).toBe(200);

  await installerContext.close();
  await adminContext.close();
});
