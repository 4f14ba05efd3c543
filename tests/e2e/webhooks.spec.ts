import http from 'node:http';
import type { AddressInfo } from 'node:net';
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { verifyWebhookSignature } from '@/lib/platform/webhooks/signature';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { signInAs } from './helpers';

/*
 * An owner adds a webhook endpoint on the company page (a receiver started here on 127.0.0.1, which the served
 * app allows outside production or with NOOKPASS_WEBHOOKS_ALLOW_LOCAL=1), copies the secret shown once, sends a
 * report, and sees the delivery listed; the receiver checks the signature with the secret the page showed.
 */

const shots = 'test-results/e2e/screens';
// WCAG 2.2 level AA, as axe-core tags its rules.
const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

async function expectAccessible(page: Page, where: string) {
  for (const size of [{ width: 1280, height: 900 }, { width: 390, height: 844 }]) {
    await page.setViewportSize(size);
    const { violations } = await new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
    expect(violations.map((v) => `${where} @ ${size.width}: ${v.id} — ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`)).toEqual([]);
  }
  await page.setViewportSize({ width: 1280, height: 900 });
}

test('an owner adds a webhook endpoint, sees its secret once, and sees the delivery after sending a report', async ({ page }) => {
  test.setTimeout(180_000);
  const received: { headers: http.IncomingHttpHeaders; body: string }[] = [];
  const receiver = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      received.push({ headers: req.headers, body: Buffer.concat(chunks).toString('utf8') });
      res.writeHead(204).end();
    });
  });
  await new Promise<void>((resolve) => receiver.listen(0, '127.0.0.1', resolve));
  const url = `http://127.0.0.1:${(receiver.address() as AddressInfo).port}/e2e-${Date.now()}`;

  try {
    await signInAs(page, 'installer@nookpass.demo');
    await page.goto('/company');
    await page.waitForLoadState('networkidle');
    const section = page.getByTestId('webhooks-section');
    await expect(section.getByRole('heading', { name: 'Webhooks' })).toBeVisible();

    // A wrong address is refused beside the field before anything is sent.
    await section.getByLabel('Endpoint address').fill('hooks.example.test/in');
    await section.getByRole('button', { name: 'Add endpoint' }).click();
    await expect(page.locator('#webhook-url-error')).toContainText('https://');

    await section.getByLabel('Endpoint address').fill(url);
    await expect(section.getByRole('checkbox', { name: /Report sent to the inspector/ })).toBeChecked();
    await expect(section.getByRole('checkbox', { name: /Inspection outcome recorded/ })).toBeChecked();
    await section.getByRole('button', { name: 'Add endpoint' }).click();
    const secret = (await page.getByTestId('webhook-secret').textContent())?.trim() ?? '';
    expect(secret).toMatch(/^whsec_[A-Za-z0-9_-]{43}$/);
    const endpoint = section.getByTestId('webhook-endpoint').filter({ hasText: url });
    await expect(endpoint.getByTestId('webhook-state')).toHaveText('Active');
    await expectAccessible(page, 'company page with a new secret');

    // A report sent to the inspector reaches the receiver, signed with that secret.
    const post = async (path: string, data: object) => {
      const res = await page.request.post(path, { data });
      expect(res.status(), `${path}: ${await res.text()}`).toBe(201);
      return res.json();
    };
    const project = await post('/api/projects', { name: `E2E webhook closet ${Date.now()} (test)`, siteAddress: '5 Hook Street (demo)', jurisdiction: 'demo-county' });
    await post(`/api/projects/${project.id}/plans`, { plan: hallClosetPassPlan });
    const check = await post(`/api/projects/${project.id}/checks`, {});
    const sent = await post(`/api/checks/${check.id}/send`, {});
    await expect.poll(() => received.length, { timeout: 60_000 }).toBeGreaterThan(0);
    const [delivery] = received;
    expect(verifyWebhookSignature(secret, delivery.body, delivery.headers['nookpass-signature'] as string)).toMatchObject({ ok: true });
    expect(JSON.parse(delivery.body)).toMatchObject({ type: 'report.sent', data: { report: { code: sent.report.code } } });

    // The page lists the delivery with its state and response code; the secret is not shown again.
    await expect
      .poll(async () => {
        await page.reload();
        return endpoint.getByTestId('webhook-delivery').first().getAttribute('data-status');
      }, { timeout: 30_000 })
      .toBe('delivered');
    const row = endpoint.getByTestId('webhook-delivery').first();
    await expect(row).toContainText('report.sent');
    await expect(row).toContainText('delivered');
    await expect(row).toContainText('204');
    await expect(row).toContainText('UTC');
    await expect(page.getByTestId('webhook-secret')).toHaveCount(0);
    expect(await page.content()).not.toContain(secret);
    await page.screenshot({ path: `${shots}/company-webhooks.png`, fullPage: true });
    await expectAccessible(page, 'company page with a delivery');

    // Removing an endpoint that has deliveries deactivates it, keeping them listed.
    await endpoint.getByRole('button', { name: `Remove ${url}` }).click();
    await expect(section.getByRole('status').filter({ hasText: 'deactivated instead' })).toBeVisible();
    await expect(endpoint.getByTestId('webhook-state')).toHaveText('Deactivated');
    await expect(endpoint.getByTestId('webhook-delivery')).toHaveCount(1);
  } finally {
    // Whatever happened above, the demo company's endpoint stops receiving once the receiver is gone.
    await page.request.fetch('/api/webhooks').then(async (res) => {
      const { endpoints } = (await res.json()) as { endpoints: { id: string; url: string; active: boolean }[] };
      for (const e of endpoints.filter((x) => x.url === url && x.active)) await page.request.delete(`/api/webhooks/${e.id}`);
    }).catch(() => undefined);
    await new Promise((resolve) => receiver.close(resolve));
  }
});
