import { expect, test, type Page } from '@playwright/test';
import { hallClosetPassPlan } from '../fixtures/plans/hall-closet-pass';
import { signInAs } from './helpers';

const shots = 'test-results/e2e/screens';

/** A fresh Demo County project holding the demo hall-closet plan as revision 1. */
async function projectWithPlan(page: Page): Promise<string> {
  const created = await page.request.post('/api/projects', {
    data: { name: `Live check ${Date.now()}`, siteAddress: '1 Demo Lane (demo)', jurisdiction: 'demo-county' },
  });
  expect(created.status()).toBe(201);
  const { id } = (await created.json()) as { id: string };
  const saved = await page.request.post(`/api/projects/${id}/plans`, { data: { plan: hallClosetPassPlan } });
  expect(saved.status()).toBe(201);
  return id;
}

const live = (page: Page) => page.getByRole('region', { name: 'Live check' });
const liveFinding = (page: Page, rule: string) => live(page).locator(`[data-testid="live-finding"][data-rule="${rule}"]`).first();
const NOT_PASSING = /^(fail|caution)$/;

/** Every rule's live status, as the panel shows it. */
async function liveStatuses(page: Page): Promise<Record<string, string>> {
  return live(page).locator('[data-testid="live-finding"]').evaluateAll((els) =>
    Object.fromEntries(els.map((el) => [el.getAttribute('data-rule')!, el.getAttribute('data-status')!])),
  );
}

for (const viewport of [{ name: 'desktop', width: 1280, height: 900 }, { name: 'phone', width: 390, height: 844 }]) {
  test(`live check follows every edit and matches the stored check (${viewport.name})`, async ({ page }) => {
    await page.setViewportSize({ width: viewport.width, height: viewport.height });
    await signInAs(page, 'installer@nookpass.demo');
    const id = await projectWithPlan(page);
    await page.goto(`/projects/${id}/plan`);
    await expect(live(page)).toHaveAttribute('data-live-state', 'ready', { timeout: 30_000 });

    // The units come from the company's appliance library: the demo hall-closet pair (invented demo models).
    for (const [slot, label] of [['washer', 'Demo HW-24 hall-closet washer (demo) (washer)'], ['dryer', 'Demo HD-24 hall-closet electric dryer (demo) (dryer)']] as const) {
      const picker = page.getByTestId(`library-picker-${slot}`);
      if (viewport.name === 'phone') await page.getByTestId(`section-toggle-${slot}`).click();
      await picker.getByLabel('Fill from the appliance library').selectOption({ label });
      await picker.getByRole('button', { name: `Fill ${slot} fields` }).click();
      await expect(page.locator(`#f-${slot}-width`)).toHaveValue('24');
    }
    if (viewport.name === 'phone') await page.getByTestId('section-toggle-enclosure').click();

    // The sizes worked out for the demo units: 33 in (2' 9") inside depth with the cautions (24 + 2 + 1 in front +
    // 6 in rear zone; plan figures and trade references, common practice), 34-1/2 in outside with 3/4 in panel and doors.
    await expect(live(page).getByTestId('size-depth-all')).toContainText(`2' 9"`);
    await expect(live(page).getByTestId('size-depth-all')).toContainText(`2' 10-1/2"`);

    // One inch too shallow for the maker's depth (31 in inside = 32-1/2 in outside): the finding fails as it is typed.
    const depth = page.locator('#f-enclosure-depth');
    await depth.fill('31.5');
    await expect(liveFinding(page, 'clearances.depth')).toHaveAttribute('data-status', NOT_PASSING);
    await expect(liveFinding(page, 'clearances.rear-zone')).toHaveAttribute('data-status', NOT_PASSING);
    await live(page).screenshot({ path: `${shots}/live-check-too-shallow-${viewport.name}.png` });

    // Its fix moves the depth once for the depth, rear-zone and hinge-arm findings; it can be undone and redone.
    const fix = liveFinding(page, 'clearances.depth').getByTestId('apply-fix');
    await expect(fix).toContainText(`2' 10-1/2"`);
    await fix.click();
    await expect(depth).toHaveValue('34.5');
    for (const rule of ['clearances.depth', 'clearances.rear-zone', 'door-hardware.hinge-arm-room']) {
      await expect(liveFinding(page, rule)).toHaveAttribute('data-status', 'pass');
    }
    await live(page).getByRole('button', { name: 'Undo' }).click();
    await expect(depth).toHaveValue('31.5');
    await expect(liveFinding(page, 'clearances.depth')).toHaveAttribute('data-status', NOT_PASSING);
    await liveFinding(page, 'clearances.depth').getByTestId('apply-fix').click();
    await expect(depth).toHaveValue('34.5');

    // Clicking a finding focuses its field.
    await depth.fill('31.5');
    await liveFinding(page, 'clearances.depth').getByRole('button').first().click();
    await expect(depth).toBeFocused();
    await depth.fill('34.5');

    // A length that does not read shows its message beside the field, and the panel says what waits for it.
    await depth.fill('34 bananas');
    await expect(page.locator('#f-enclosure-depth-error')).toBeVisible();
    await expect(live(page).getByTestId('live-waiting')).toContainText('Enclosure depth');
    await depth.fill('34.5');
    await expect(live(page).getByTestId('live-waiting')).toHaveCount(0);

    // Lengthen the exhaust's long straight run past 35 ft of developed length (IRC 2018 M1502.4.5.1), then back.
    if (viewport.name === 'phone') await page.getByTestId('section-toggle-exhaust').click();
    const straight = page.locator('#f-exhaust-run-2-straight');
    await straight.fill('40 ft');
    await expect(liveFinding(page, 'exhaust.developed-length')).toHaveAttribute('data-status', 'fail');
    await straight.fill('12 ft');
    await expect(liveFinding(page, 'exhaust.developed-length')).toHaveAttribute('data-status', 'pass');

    // Accept the proposed door leaves and hinges.
    const proposal = live(page).getByTestId('door-proposal');
    await expect(proposal.getByTestId('door-proposal-result')).toBeVisible();
    await proposal.getByRole('button', { name: 'Use these doors in the plan' }).click();
    // 54-1/2 in inside less three 1/8 in reveals, halved: 27-1/16 in (common practice reveals, no published source).
    await expect(page.locator('#f-doors-0-width')).toHaveValue('27.0625');
    await expect(page.locator('#f-doors-1-width')).toHaveValue('27.0625');
    // A 78 in leaf is under 2000 mm: four hinges (hinge makers' charts).
    await expect(page.locator('#f-doors-0-hinges')).toHaveValue(/^[\d.]+, [\d.]+, [\d.]+, [\d.]+$/);
    await expect(liveFinding(page, 'door-hardware.hinge-count')).toHaveAttribute('data-status', 'pass');
    await expect(liveFinding(page, 'door-hardware.hinge-positions')).toHaveAttribute('data-status', 'pass');

    // Save and check: the stored check is the record, and it matches the live one rule for rule.
    await page.waitForTimeout(100);
    const seen = await liveStatuses(page);
    await page.getByRole('button', { name: 'Save and check' }).click();
    await page.waitForURL(/\/checks\/[0-9a-f-]{36}$/);
    const checkId = new URL(page.url()).pathname.split('/').pop()!;
    const stored = (await (await page.request.get(`/api/checks/${checkId}`)).json()) as { findings: Array<{ ruleKey: string; status: string }> };
    const shown = Object.fromEntries(stored.findings.filter((f) => f.status !== 'not-applicable').map((f) => [f.ruleKey, f.status]));
    expect(seen).toEqual(shown);
  });
}

test('a too-long exhaust route offers to take an elbow out, and the change can be undone', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'installer@nookpass.demo');
  const id = await projectWithPlan(page);
  await page.goto(`/projects/${id}/plan`);
  await expect(live(page)).toHaveAttribute('data-live-state', 'ready', { timeout: 30_000 });

  // IRC 2018 M1502.4.5.1: 35 ft developed length; Table M1502.4.5.1: mitered 90° elbow 5 ft, 6-in smooth 90° 1 ft 9 in.
  // 2 ft + 25 ft + 1 ft 6 in straight + 6 ft 9 in of elbows = 35 ft 3 in.
  await page.locator('#f-exhaust-run-2-straight').fill('25 ft');
  const finding = liveFinding(page, 'exhaust.developed-length');
  await expect(finding).toHaveAttribute('data-status', 'fail');
  const remove = finding.locator('[data-testid="apply-fix"][data-fix-kind="remove-item"]');
  await expect(remove).toHaveText('Remove piece 2 (90° elbow)');
  await remove.click();
  await expect(page.getByTestId('route-item')).toHaveCount(4);
  await expect(finding).toHaveAttribute('data-status', 'pass');
  await expect(live(page).getByTestId('applied-change')).toContainText('piece 2 (90° elbow) taken out');

  await live(page).getByRole('button', { name: 'Undo' }).click();
  await expect(page.getByTestId('route-item')).toHaveCount(5);
  await expect(page.locator('#f-exhaust-run-2-straight')).toHaveValue('25 ft');
  await expect(finding).toHaveAttribute('data-status', 'fail');
});
