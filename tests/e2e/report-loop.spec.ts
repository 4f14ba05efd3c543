import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';

const shots = 'test-results/e2e/screens';

test('installer downloads and sends a report, the verification page accepts it, the inspector reviews, the installer sees the outcome', async ({ page, browser }) => {
  test.setTimeout(150_000);
  await signInAs(page, 'installer@nookpass.demo');
  await page.goto('/projects');
  // Other test suites add projects to this company; search rather than rely on the first page.
  await page.getByLabel('Search projects').fill('bypass-door closet');
  await page.getByRole('link', { name: /Demo — bypass-door closet/ }).click();
  await expect(page).toHaveURL(/\/projects\/[0-9a-f-]{36}$/);
  const projectUrl = page.url();
  await page.getByRole('button', { name: 'Run check' }).first().click();
  await expect(page.locator('[data-rule="exhaust.developed-length"]')).toBeVisible();

  // Download: a PDF whose code the verification page knows.
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('download-report').click()]);
  expect(download.suggestedFilename()).toMatch(/^nookpass-demo-bypass-door-closet-48-sample-road-NP(?:-[A-Z2-9]{4}){4}\.pdf$/);
  const file = await download.path();
  const code = download.suggestedFilename().match(/NP(?:-[A-Z2-9]{4}){4}/)![0];

  const verify = await browser.newPage();
  await verify.goto(`/verify/${code}`);
  await expect(verify.getByRole('heading', { name: `Report ${code} was issued by NookPass` })).toBeVisible();
  await verify.locator('#verify-file').setInputFiles(file);
  await expect(verify.getByTestId('verify-result')).toContainText('Genuine');
  // One changed byte and it is no longer the issued file.
  const altered = Buffer.from(readFileSync(file));
  altered[altered.length - 10] ^= 0xff;
  await verify.locator('#verify-file').setInputFiles({ name: 'altered.pdf', mimeType: 'application/pdf', buffer: altered });
  await expect(verify.getByTestId('verify-result')).toContainText('Not the issued file');
  await verify.screenshot({ path: `${shots}/verify.png`, fullPage: true });
  await verify.close();

  // An address that is neither the inspector's nor one the company used: the form asks, and Cancel sends nothing.
  const stranger = `e2e-${Date.now()}@example.test`;
  await page.getByLabel(/Inspector.s e-mail/).fill(stranger);
  await page.getByRole('button', { name: 'Send to inspector' }).click();
  // The bypass-door closet's check has failing findings: that is asked first, then the address.
  await page.getByRole('button', { name: 'Send with failing findings' }).click();
  await expect(page.getByTestId('send-confirm')).toContainText(`Send this report to ${stranger}?`);
  await expect(page.getByTestId('send-confirm')).toContainText('inspector@nookpass.demo');
  await page.getByRole('button', { name: 'Cancel' }).click();
  await expect(page.getByTestId('send-confirm')).toHaveCount(0);
  await expect(page.getByTestId('send-result')).toHaveCount(0);

  // Send to the jurisdiction's inspector: no question asked, and it lands in the inspector's queue.
  await page.getByLabel(/Inspector.s e-mail/).fill('inspector@nookpass.demo');
  await page.getByRole('button', { name: 'Send to inspector' }).click();
  await page.getByRole('button', { name: 'Send with failing findings' }).click();
  await expect(page.getByTestId('send-result')).toContainText('sent to inspector@nookpass.demo');
  await expect(page.getByTestId('send-result')).toContainText('in the inspector’s queue');
  const sentCode = (await page.getByTestId('send-result').textContent())!.match(/NP(?:-[A-Z2-9]{4}){4}/)![0];

  // The inspector sees it, opens it and asks for corrections.
  const ctx = await browser.newContext();
  const insp = await ctx.newPage();
  await signInAs(insp, 'inspector@nookpass.demo');
  await expect(insp).toHaveURL(/\/inspections$/);
  await insp.getByRole('row', { name: new RegExp(sentCode) }).getByRole('link').click();
  await expect(insp.getByRole('heading', { name: /Demo — bypass-door closet/ })).toBeVisible();
  await insp.getByLabel('Corrections needed').check();
  await insp.getByLabel('Comment to the installer').fill('Shorten the exhaust run and add the closet opening.');
  await insp.getByLabel(/Exhaust duct developed length/).fill('Over the 35 ft limit.');
  await insp.getByRole('button', { name: 'Record outcome' }).click();
  await expect(insp.getByText('Outcome recorded and the e-mail to the installer is queued.')).toBeVisible();
  await insp.screenshot({ path: `${shots}/inspection.png`, fullPage: true });
  await ctx.close();

  // Back to the installer: the outcome is on the project.
  await page.goto(projectUrl);
  const outcomes = page.getByTestId('inspection-outcomes');
  await expect(outcomes).toContainText('Corrections needed');
  await expect(outcomes).toContainText('Shorten the exhaust run');
  await expect(page.getByTestId('sends')).toContainText(sentCode);
});
