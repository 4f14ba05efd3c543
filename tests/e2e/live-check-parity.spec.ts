import { build } from 'esbuild';
import fc from 'fast-check';
import { expect, test } from '@playwright/test';
import { fixturePlans, generatedPlan } from '../fixtures/generated-plans';
import { signInAs } from './helpers';

/*
 * The browser and the server give the same findings: the live check's own module, bundled for the browser,
 * runs in Chromium against the published rule set the live panel fetches, and every plan is also sent to
 * POST /api/evaluations. Plans: every fixture and a few hundred generated from them (fast-check, fixed seed).
 */
const GENERATED = 300;

test('the live engine in Chromium and POST /api/evaluations give identical findings', async ({ page }) => {
  test.setTimeout(240_000);
  await signInAs(page, 'installer@nookpass.demo');
  const jurisdictions = (await (await page.request.get('/api/jurisdictions')).json()) as Array<{ slug: string; publishedVersion: number | null }>;
  const county = jurisdictions.find((j) => j.slug === 'demo-county')!;
  const ruleSetResponse = await page.request.get(`/api/jurisdictions/demo-county/published/${county.publishedVersion}`);
  expect(ruleSetResponse.headers()['cache-control']).toContain('immutable');
  const ruleSet = await ruleSetResponse.json();

  const bundle = await build({ entryPoints: ['tests/e2e/support/live-engine-entry.ts'], bundle: true, platform: 'browser', format: 'iife', write: false, logLevel: 'error',
    // What the app's bundler also defines for browser code.
    define: { global: 'globalThis', 'process.env.NODE_ENV': '"production"' },
  });
  // A blank page: the app's pages allow only their own scripts (CSP), and the bundle needs nothing of theirs.
  await page.setContent('<!doctype html><html lang="en"><head><title>Live engine</title></head><body></body></html>');
  await page.addScriptTag({ content: bundle.outputFiles[0].text });

  const plans = [...fixturePlans, ...fc.sample(generatedPlan, { numRuns: GENERATED, seed: 1404 })];
  const browser = (await page.evaluate(
    async ({ ruleSet, plans }) => {
      const live = (globalThis as any).nookpassLive;
      const out = [];
      for (const plan of plans) {
        const parsed = live.parsePlan(plan);
        if (!parsed.ok) {
          out.push({ errors: parsed.errors });
          continue;
        }
        const result = await live.runLive(ruleSet, plan);
        out.push({ ruleSet: result.evaluation.ruleSet, summary: result.evaluation.summary, findings: result.evaluation.findings });
      }
      return JSON.parse(JSON.stringify(out));
    },
    { ruleSet, plans },
  )) as Array<Record<string, unknown>>;

  let compared = 0;
  for (const [i, plan] of plans.entries()) {
    const res = await page.request.post('/api/evaluations', { data: { jurisdiction: 'demo-county', plan } });
    const server = await res.json();
    if (res.status() === 400) {
      // A plan the server refuses is refused in the browser too, naming the same fields.
      expect(browser[i].errors, `plan ${i}`).toBeDefined();
      const paths = (e: Array<{ path: string }>) => e.map((x) => x.path.replace(/^plan\./, '')).sort();
      expect(paths(browser[i].errors as Array<{ path: string }>), `plan ${i}`).toEqual(paths(server.errors));
      continue;
    }
    expect(res.status(), `plan ${i}`).toBe(200);
    expect(browser[i], `plan ${i}`).toEqual(server);
    compared += 1;
  }
  // Most generated plans parse, so the comparison covers far more than the fixtures.
  expect(compared).toBeGreaterThan(GENERATED / 2);
});
