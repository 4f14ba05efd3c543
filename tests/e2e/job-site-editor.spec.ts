import { expect, test, type Page } from '@playwright/test';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { signInAs } from './helpers';

const phone = { width: 390, height: 844 };

// 38 ft developed: 28 ft straight plus two mitered 90° elbows at 5 ft each, over the 35 ft of IRC M1502.4.5.1
// (IRC 2018 Table M1502.4.5.1 for the elbow equivalents).
const longRoute = [{ straight: '20 ft' }, { elbow: 90, fitting: 'mitered' }, { straight: `8'` }, { elbow: 90, fitting: 'mitered' }];

async function projectWithPlan(page: Page, plan: unknown, check: boolean): Promise<string> {
  const project = await page.request.post('/api/projects', { data: { name: `E2E job site ${Date.now()} (test)`, siteAddress: '3 Site Street', jurisdiction: 'demo-county' } });
  expect(project.status()).toBe(201);
  const { id } = (await project.json()) as { id: string };
  expect((await page.request.post(`/api/projects/${id}/plans`, { data: { plan } })).status()).toBe(201);
  if (check) expect((await page.request.post(`/api/projects/${id}/checks`, { data: {} })).status()).toBe(201);
  return id;
}

test('on a phone the plan sections collapse to their title and failing count, one open at a time', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'installer2@nookpass.demo');
  await page.setViewportSize(phone);
  const id = await projectWithPlan(page, { ...hallClosetPassPlan, exhaust: { ...hallClosetPassPlan.exhaust, run: longRoute } }, true);
  await page.goto(`/projects/${id}/plan`);

  // Each section is a fieldset named by its legend.
  await expect(page.getByRole('group', { name: /^Enclosure/ })).toBeVisible();
  await expect(page.getByTestId('section-body-space')).toBeVisible();
  await expect(page.getByTestId('section-body-enclosure')).toBeHidden();
  await expect(page.getByTestId('section-body-exhaust')).toBeHidden();

  // The stored check failed the developed length, which reads the exhaust route, and nothing about the enclosure size.
  const exhaustToggle = page.getByTestId('section-toggle-exhaust');
  await expect(exhaustToggle).toContainText(/Dryer exhaust\s*[1-9]\d* failing/);
  await expect(page.getByTestId('section-toggle-space')).toContainText('none failing');

  await page.getByTestId('section-toggle-enclosure').click();
  await expect(page.getByTestId('section-toggle-enclosure')).toHaveAttribute('aria-expanded', 'true');
  await expect(page.getByTestId('section-body-enclosure')).toBeVisible();
  await expect(page.getByTestId('section-body-space')).toBeHidden();

  // The jump list opens the section it names and closes the one that was open.
  await page.getByRole('navigation', { name: 'Plan sections' }).getByRole('link', { name: /Dryer exhaust/ }).click();
  await expect(page.getByTestId('section-body-exhaust')).toBeVisible();
  await expect(page.getByTestId('section-body-enclosure')).toBeHidden();
  await expect(page.getByTestId('route-item')).toHaveCount(4);
  await page.screenshot({ path: 'test-results/e2e/screens/plan-editor-phone.png', fullPage: true });

  // Touch targets of the open section, the toggles and the jump list are at least 44 px.
  const targets = page.locator('form button:visible, form input:visible, form select:visible, nav[aria-label="Plan sections"] a');
  const boxes = await targets.evaluateAll((els) => els.map((el) => {
    const r = el.getBoundingClientRect();
    return { what: el.id || el.textContent?.trim().slice(0, 30), width: r.width, height: r.height };
  }));
  expect(boxes.length).toBeGreaterThan(20);
  // 44 px: common platform touch guidance (WCAG 2.2 2.5.5, AAA, asks 44 × 44 CSS px).
  const small = boxes.filter((b) => b.height < 44 || b.width < 44);
  expect(small).toEqual([]);

  // Lengths open the decimal keyboard; feet and inch marks have keys of their own.
  const diameter = page.locator('#f-exhaust-diameter');
  await expect(diameter).toHaveAttribute('inputmode', 'decimal');
  const straight = page.locator('#f-exhaust-run-0-straight');
  await expect(straight).toHaveAttribute('inputmode', 'decimal');
  await straight.fill('2');
  await page.getByRole('button', { name: 'Type a feet mark in Straight length' }).first().click();
  await page.keyboard.type('6');
  await page.getByRole('button', { name: 'Type a inch mark in Straight length' }).first().click();
  await expect(straight).toHaveValue(`2'6"`);
  await expect(straight).toBeFocused();
  await expect(page.getByTestId('convert-exhaust.run.0.straight')).toContainText(`2' 6"`);

  // Adding a piece puts the keyboard in it; removing one leaves it on the neighbouring piece's remove key.
  await page.getByRole('button', { name: 'Add straight run' }).click();
  await expect(page.locator('#f-exhaust-run-4-straight')).toBeFocused();
  await page.keyboard.type('3 ft');
  await page.getByRole('button', { name: 'Add 90° elbow' }).click();
  await expect(page.locator('#f-exhaust-run-5-elbow')).toBeFocused();
  await page.getByRole('button', { name: 'Remove piece 6' }).click();
  await expect(page.getByRole('button', { name: 'Remove piece 5' })).toBeFocused();
  await page.getByRole('button', { name: 'Remove piece 2' }).click();
  await expect(page.getByRole('button', { name: 'Remove piece 2' })).toBeFocused();
  await expect(page.getByTestId('route-item')).toHaveCount(4);
});

test('the server writes the saved plan into the form: with JavaScript off every saved value is there', async ({ page, browser }) => {
  await signInAs(page, 'installer2@nookpass.demo');
  const plan = { ...hallClosetPassPlan, enclosure: { ...hallClosetPassPlan.enclosure, width: `4' 6"` }, exhaust: { ...hallClosetPassPlan.exhaust, run: longRoute } };
  const id = await projectWithPlan(page, plan, false);
  const noScript = await browser.newContext({ javaScriptEnabled: false, storageState: await page.context().storageState(), viewport: { width: 1280, height: 900 } });
  try {
    const bare = await noScript.newPage();
    await bare.goto(`/projects/${id}/plan`);
    await expect(bare.locator('#f-enclosure-width')).toHaveValue(`4' 6"`);
    await expect(bare.locator('#f-enclosure-height')).toHaveValue(String(hallClosetPassPlan.enclosure.height));
    await expect(bare.locator('#f-dryer-fuel')).toHaveValue(hallClosetPassPlan.dryer.fuel);
    await expect(bare.locator('#f-exhaust-run-0-straight')).toHaveValue('20 ft');
    await expect(bare.locator('#f-exhaust-run-1-elbow')).toHaveValue('90');
    await expect(bare.locator('#f-exhaust-run-2-straight')).toHaveValue(`8'`);
    await expect(bare.getByTestId('route-item')).toHaveCount(4);
  } finally {
    await noScript.close();
  }
});

test('on the check page the findings come before the report forms', async ({ page }) => {
  await signInAs(page, 'installer2@nookpass.demo');
  await page.setViewportSize(phone);
  const id = await projectWithPlan(page, hallClosetPassPlan, true);
  const { checks } = (await (await page.request.get(`/api/projects/${id}/checks`)).json()) as { checks: { id: string }[] };
  const checkId = checks[0]?.id;
  expect(checkId).toBeTruthy();
  await page.goto(`/projects/${id}/checks/${checkId}`);
  const findings = page.getByTestId('check-findings');
  const actions = page.getByTestId('check-report-actions');
  await expect(findings).toBeVisible();
  await expect(actions).toBeVisible();
  const findingsFirst = await findings.evaluate((f) => {
    const a = document.querySelector('[data-testid="check-report-actions"]')!;
    return Boolean(f.compareDocumentPosition(a) & Node.DOCUMENT_POSITION_FOLLOWING);
  });
  expect(findingsFirst).toBe(true);
  const [fy, ay] = [(await findings.boundingBox())!.y, (await actions.boundingBox())!.y];
  expect(fy).toBeLessThan(ay);
});

test('a large photo is scaled in the browser to 2,560 px on its longest side and the upload shows its progress', async ({ page }) => {
  test.setTimeout(90_000);
  await signInAs(page, 'installer2@nookpass.demo');
  const project = await page.request.post('/api/projects', { data: { name: `E2E photo ${Date.now()} (test)`, siteAddress: '4 Photo Street', jurisdiction: 'demo-county' } });
  const { id } = (await project.json()) as { id: string };
  await page.setViewportSize(phone);
  await page.goto(`/projects/${id}`);

  // A 4000 × 3000 photo, as a phone camera makes them.
  const sharp = (await import('sharp')).default;
  const big = await sharp({ create: { width: 4000, height: 3000, channels: 3, background: { r: 180, g: 150, b: 110 } } }).jpeg({ quality: 90 }).toBuffer();
  await page.locator('#att-file').setInputFiles({ name: 'nameplate.jpg', mimeType: 'image/jpeg', buffer: big });
  await page.getByLabel('Caption').fill('dryer nameplate (test)');

  // A slow link, so the progress is there to see.
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 50, downloadThroughput: 500_000, uploadThroughput: 20_000 });
  await page.getByRole('button', { name: 'Upload' }).click();
  await expect(page.getByTestId('upload-progress')).toContainText(/Uploading: \d+ %/);
  await expect(page.getByTestId('upload-note')).toHaveText('Uploaded nameplate.jpg, scaled from 4000 × 3000 to 2560 × 1920 px.', { timeout: 60_000 });
  await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

  const { attachments } = (await (await page.request.get(`/api/projects/${id}/attachments`)).json()) as { attachments: { id: string; caption: string }[] };
  const stored = attachments.find((a) => a.caption === 'dryer nameplate (test)');
  expect(stored).toBeTruthy();
  const original = await page.request.get(`/api/attachments/${stored!.id}`);
  expect(original.status()).toBe(200);
  const meta = await sharp(await original.body()).metadata();
  // 4000 × 3000 scaled by 2560 / 4000 = 0.64 is 2560 × 1920.
  expect({ width: meta.width, height: meta.height, format: meta.format }).toEqual({ width: 2560, height: 1920, format: 'jpeg' });
});
