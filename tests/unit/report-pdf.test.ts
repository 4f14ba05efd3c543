import { extractText, getDocumentProxy } from 'unpdf';
import { describe, expect, it } from 'vitest';
import { evaluate } from '@/lib/domain/engine';
import { parsePlan } from '@/lib/domain/plan';
import { countPdfPages, renderReportPdf, sha256Hex } from '@/lib/platform/pdf/render';
import type { ReportData } from '@/lib/domain/reports/report-data';
import { buildRuleSet } from '@/rules';
import { longExhaustFailPlan } from '@/tests/fixtures/plans';

const editions = { building: 'IRC 2018', electrical: 'NEC 2017', plumbing: 'IPC 2018', plumbingFamily: 'IPC' as const, mechanical: 'IMC 2018', fuelGas: 'IFGC 2018' };

async function sampleData(): Promise<ReportData> {
  const parsed = parsePlan(longExhaustFailPlan);
  if (!parsed.ok) throw new Error('demo plan must parse');
  const built = buildRuleSet(editions);
  const evaluation = await evaluate({ jurisdiction: 'test-county', version: 3, parameters: built.parameters, rules: built.rules }, parsed.plan);
  return {
    code: 'NP-TEST-2345',
    verifyUrl: 'http://127.0.0.1:3000/verify/NP-TEST-2345',
    generatedAt: new Date('2026-12-02T10:00:00Z'),
    project: { name: 'Test closet <b>not bold</b>', siteAddress: '1 Test Street', permitNumber: null, isDemo: true },
    organization: { name: 'Test Company', licenseNumber: null },
    jurisdiction: { name: 'Test County', region: 'Test State', editions, amendmentNotes: '', timeZone: 'UTC' },
    ruleSet: { version: 3, publishedAt: new Date('2026-11-01T00:00:00Z'), changelog: 'Test version' },
    planRevision: { number: 2, savedBy: 'Tester', savedAt: new Date('2026-12-01T09:00:00Z') },
    check: { id: 'c', createdAt: new Date('2026-12-01T09:05:00Z'), runBy: 'Tester', summary: evaluation.summary, outcome: 'fail' },
    findings: evaluation.findings,
    plan: parsed.plan,
    parameters: built.parameters,
    photos: [],
    documents: [],
    preparedBy: 'Tester',
  };
}

async function pdfText(pdf: Buffer): Promise<{ text: string; pages: number }> {
  const doc = await getDocumentProxy(new Uint8Array(pdf));
  const { text, totalPages } = await extractText(doc, { mergePages: true });
  return { text: text.replace(/\s+/g, ' '), pages: totalPages };
}

describe('report PDF', () => {
  it('carries the citations and measured values of the findings, the code on every page and the AHJ statement', async () => {
    const data = await sampleData();
    const { pdf, sha256, pageCount } = await renderReportPdf(data);
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    const { text, pages } = await pdfText(pdf);
    expect(pageCount).toBe(pages);
    // IRC 2018 M1502.4.5.1: 35 ft; the demo route develops 45 ft 6 in (Table M1502.4.5.1).
    expect(text).toContain('IRC 2018 M1502.4.5.1');
    expect(text).toContain(`45' 6"`);
    expect(text).toContain(`35' 0"`);
    expect(text).toContain('IMC 2018 504.6');
    expect(text).toContain('the authority having jurisdiction (AHJ) and licensed trades govern');
    const codeCount = text.split('NookPass report NP-TEST-2345').length - 1;
    expect(codeCount).toBe(pages);
    expect(text).toContain(`Page 1 of ${pages}`);
    expect(text).toContain('Test closet <b>not bold</b>'); // markup is text, never interpreted
    expect(sha256).toBe(sha256Hex(pdf));
  });

  it('says a plan too large to draw is not drawn, naming the list, and keeps the findings', async () => {
    const data = await sampleData();
    const withheld = await renderReportPdf({ ...data, drawingsWithheld: ['Doors item 1 hinges: at most 12 hinge positions on a door; this plan has 100,000.'] });
    const { text } = await pdfText(withheld.pdf);
    expect(text).toContain('Plan revision 2 is too large to draw, so this report has no drawings or hinge layout.');
    expect(text).toContain('Doors item 1 hinges: at most 12 hinge positions on a door; this plan has 100,000.');
    expect(text).not.toContain('Hinge layout');
    expect(text).toContain('IRC 2018 M1502.4.5.1'); // the findings are still there

    // A plan handed over without the notice is still measured before it is drawn.
    const hinges = Array.from({ length: 100_000 }, (_, i) => 1 + (i % 70));
    const started = performance.now();
    const direct = await renderReportPdf({ ...data, plan: { ...data.plan, doors: [{ kind: 'hinged', height: 78, hinges }] } });
    expect(performance.now() - started).toBeLessThan(10_000);
    expect((await pdfText(direct.pdf)).text).toContain('this plan has 100,000');
  });

  it('counts pages', () => {
    expect(countPdfPages(Buffer.from('<< /Type /Pages /Kids [3 0 R 4 0 R 5 0 R] /Count 3 >> << /Type /Pages /Count 2 >>'))).toBe(3);
  });
});
