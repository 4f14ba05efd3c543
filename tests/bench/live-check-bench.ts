import { gzipSync } from 'node:zlib';
import { chromium } from '@playwright/test';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, baseUrl, postJson, signIn } from '../integration/helpers';

const CHROMIUM_ARGS = ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'];

const percentile = (xs: number[], p: number) => {
  const sorted = [...xs].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
};

export interface LiveCheckBench {
  edits: number;
  /** From the input event to the live panel's DOM showing that edit's findings. */
  toPanelMs: { median: number; p95: number; max: number };
  /** From the input event to the next animation frame after the panel changed (what the eye can see). */
  toFrameMs: { median: number; p95: number };
  /** JavaScript the page loaded after the form was usable: the live engine, rules and drawings. */
  lazyJs: { scripts: number; gzipKiB: number };
}

/**
 * In Chromium on the plan editor: types `edits` enclosure depths one after another, alternating a passing and a
 * too-shallow depth so every edit changes the findings, and times each edit to the updated panel.
 */
export async function measureLiveCheck(edits = 200): Promise<LiveCheckBench> {
  const cookie = await signIn('installer@nookpass.demo');
  const project = await api('/api/projects', postJson({ name: 'Bench live check (demo)', siteAddress: '1 Bench Lane (demo)', jurisdiction: 'demo-county' }, { cookie }));
  await api(`/api/projects/${project.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie }));
  const browser = await chromium.launch({ executablePath: process.env.NOOKPASS_CHROMIUM ?? '/usr/bin/chromium', args: CHROMIUM_ARGS });
  try {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    await context.addCookies(cookie.split(/;\s*/).filter(Boolean).map((pair) => {
      const [name, ...rest] = pair.split('=');
      return { name, value: rest.join('='), url: baseUrl };
    }));
    const page = await context.newPage();
    const response = await page.goto(`${baseUrl}/projects/${project.body.id}/plan`);
    const html = (await response?.text()) ?? '';
    const initial = new Set([...html.matchAll(/<script[^>]+src="([^"]+\.js)"/g)].map((m) => new URL(m[1], baseUrl).href));
    await page.locator('[data-testid="live-check"][data-live-state="ready"]').waitFor({ timeout: 60_000 });
    await page.locator('[data-testid="live-result"]').waitFor();

    const timings = await page.evaluate(async (count) => {
      const input = document.querySelector<HTMLInputElement>('#f-enclosure-depth')!;
      const result = () => document.querySelector('[data-testid="live-result"]')!;
      const setter = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!;
      const toPanel: number[] = [];
      const toFrame: number[] = [];
      for (let i = 0; i < count; i++) {
        const before = result().getAttribute('data-runs');
        const changed = new Promise<number>((resolve) => {
          const observer = new MutationObserver(() => {
            if (result().getAttribute('data-runs') !== before) {
              observer.disconnect();
              resolve(performance.now());
            }
          });
          observer.observe(document.querySelector('[data-testid="live-check"]')!, { attributes: true, subtree: true, childList: true });
        });
        const t0 = performance.now();
        setter.call(input, i % 2 === 0 ? '31.5' : '34.5');
        input.dispatchEvent(new Event('input', { bubbles: true }));
        const t1 = await changed;
        const t2 = await new Promise<number>((resolve) => requestAnimationFrame(() => resolve(performance.now())));
        toPanel.push(t1 - t0);
        toFrame.push(t2 - t0);
        // Let the sizes and drawings that follow a change settle, as they would between keystrokes.
        await new Promise((resolve) => setTimeout(resolve, 60));
      }
      return { toPanel, toFrame };
    }, edits);

    const loaded = await page.evaluate(() => performance.getEntriesByType('resource').map((e) => e.name).filter((n) => /\.js(\?|$)/.test(n)));
    const lazy = [...new Set(loaded)].filter((src) => !initial.has(src) && src.startsWith(baseUrl));
    let gz = 0;
    for (const src of lazy) gz += gzipSync(Buffer.from(await (await fetch(src, { headers: { cookie } })).arrayBuffer())).length;
    const round = (x: number) => +x.toFixed(1);
    return {
      edits,
      toPanelMs: { median: round(percentile(timings.toPanel, 50)), p95: round(percentile(timings.toPanel, 95)), max: round(Math.max(...timings.toPanel)) },
      toFrameMs: { median: round(percentile(timings.toFrame, 50)), p95: round(percentile(timings.toFrame, 95)) },
      lazyJs: { scripts: lazy.length, gzipKiB: Math.round(gz / 1024) },
    };
  } finally {
    await browser.close();
  }
}
