import path from 'node:path';
import sharp from 'sharp';
import { extractText, getDocumentProxy } from 'unpdf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { evaluate } from '@/lib/domain/engine';
import { ServiceUnavailableError } from '@/lib/domain/errors';
import { parsePlan } from '@/lib/domain/plan';
import { renderReportPdf } from '@/lib/platform/pdf/render';
import { closeReportRenderPool, renderReportOffThread } from '@/lib/platform/pdf/render-pool';
import type { ReportData } from '@/lib/domain/reports/report-data';
import { buildRuleSet } from '@/rules';
import { buildReportWorker } from '@/scripts/build-report-worker.mjs';
import { longestStallMs } from '@/tests/fixtures/event-loop';
import { largestAllowedPlan } from '@/tests/fixtures/plans';

/*
 * The worker pool runs the same bundle `npm run build` makes (scripts/build-report-worker.mjs), built
 * here into test-results/, so the production worker is what is tested: it must load, render the whole
 * report with photos from structured-cloned data, leave the calling thread's event loop free, and stop
 * at its time limit.
 */

const editions = { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC' as const, mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' };
let data: ReportData;

beforeAll(async () => {
  process.env.NOOKPASS_REPORT_WORKER = await buildReportWorker(path.join(process.cwd(), 'test-results', 'report-worker', 'render-worker.mjs'));
  const parsed = parsePlan(largestAllowedPlan);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  const built = buildRuleSet(editions);
  const evaluation = await evaluate({ jurisdiction: 'pool-test', version: 1, parameters: built.parameters, rules: built.rules }, parsed.plan);
  const photo = await sharp({ create: { width: 1200, height: 900, channels: 3, background: '#8aa' } }).jpeg({ quality: 80 }).toBuffer();
  data = {
    code: 'NP-POOL-TEST',
    verifyUrl: 'http://127.0.0.1/verify/NP-POOL-TEST',
    generatedAt: new Date('2026-12-02T10:00:00Z'),
    project: { name: 'Largest allowed closet (test)', siteAddress: '1 Pool Street', permitNumber: null, isDemo: true },
    organization: { name: 'Test Company', licenseNumber: null },
    jurisdiction: { name: 'Test County', region: 'Test State', editions, amendmentNotes: '', timeZone: 'UTC' },
    ruleSet: { version: 1, publishedAt: new Date('2026-11-01T00:00:00Z'), changelog: '' },
    planRevision: { number: 1, savedBy: 'Tester', savedAt: new Date('2026-12-01T09:00:00Z') },
    check: { id: 'c', createdAt: new Date('2026-12-01T09:05:00Z'), runBy: 'Tester', summary: evaluation.summary, outcome: 'fail' },
    findings: evaluation.findings,
    plan: parsed.plan,
    parameters: built.parameters,
    photos: [1, 2, 3].map((i) => ({ caption: `Photo ${i}`, filename: `p${i}.jpg`, image: photo, width: 1200, height: 900 })),
    documents: [],
    preparedBy: 'Tester',
  };
}, 120_000);

afterAll(async () => {
  await closeReportRenderPool();
  delete process.env.NOOKPASS_REPORT_WORKER;
});

describe('report rendering in the worker pool', () => {
  it('gives the same report as this thread, photos included, and leaves this thread free (stalls under 100 ms, a tenth of an in-thread render on a busy machine)', { timeout: 120_000 }, async () => {
    let offThread!: Awaited<ReturnType<typeof renderReportOffThread>>;
    let inThread!: Awaited<ReturnType<typeof renderReportPdf>>;
    const offStall = await longestStallMs(async () => (offThread = await renderReportOffThread(data)));
    // The same render on this thread, to show the measure catches a held loop.
    const inStall = await longestStallMs(async () => (inThread = await renderReportPdf(data)));
    expect(inStall).toBeGreaterThan(100);
    // On an idle machine the loop is never held 100 ms; when other test files hold both cores the OS alone
    // can delay a timer that long, so the bound there is a tenth of what rendering on this thread holds it.
    expect(offStall).toBeLessThan(Math.max(100, inStall / 10));

    expect(Buffer.isBuffer(offThread.pdf)).toBe(true);
    expect(offThread.pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(offThread.pageCount).toBe(inThread.pageCount);
    const doc = await getDocumentProxy(new Uint8Array(offThread.pdf));
    const { text } = await extractText(doc, { mergePages: true });
    expect(text).toContain('Door 8 — hinges on the');
    expect(text).toContain('Photo 3');
    // Byte sizes agree to within the creation time and ids react-pdf writes into each file.
    expect(Math.abs(offThread.pdf.length - inThread.pdf.length)).toBeLessThan(200);
  });

  it('stops a render past its time limit with a 503-class error, and renders the next one', { timeout: 120_000 }, async () => {
    const started = performance.now();
    const err = await renderReportOffThread(data, { timeoutMs: 50 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ServiceUnavailableError);
    expect((err as Error).message).toMatch(/took longer than 0 s to render and was stopped; nothing was recorded/);
    expect(performance.now() - started).toBeLessThan(2_000);
    const next = await renderReportOffThread(data);
    expect(next.pageCount).toBeGreaterThan(4);
  });
});
