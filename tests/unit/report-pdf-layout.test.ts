import jsQR from 'jsqr';
import { extractImages, getDocumentProxy } from 'unpdf';
import { beforeAll, describe, expect, it } from 'vitest';
import { evaluate } from '@/lib/domain/engine';
import { parsePlan, type PlanInput } from '@/lib/domain/plan';
import type { ReportData } from '@/lib/domain/reports/report-data';
import { areaTitles } from '@/lib/domain/vocabulary';
import { renderReportPdf } from '@/lib/platform/pdf/render';
import { buildRuleSet } from '@/rules';
import { gasWalkInBedroomPlan, hallClosetPassPlan, largestAllowedPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';

/*
 * The report as a reader meets it: lengths in the web's words, one date format, a QR code that leads to
 * the verification page, and pages that each carry content. Text and positions come from the rendered
 * PDF through unpdf (pdf.js); the QR code is read back from the PDF's own image with jsQR.
 */

// pdf.js (inside unpdf) copies image data with ArrayBuffer.prototype.transferToFixedLength (ES2024), which
// Node 20 lacks; without it the page's images are silently skipped. Same result, copied by hand.
const arrayBufferProto = ArrayBuffer.prototype as unknown as { transferToFixedLength?: (length?: number) => ArrayBuffer };
arrayBufferProto.transferToFixedLength ??= function (this: ArrayBuffer, length?: number) {
  const copy = new ArrayBuffer(length ?? this.byteLength);
  new Uint8Array(copy).set(new Uint8Array(this, 0, Math.min(copy.byteLength, this.byteLength)));
  return copy;
};

const editions = { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC' as const, mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' };
const VERIFY_URL = 'https://reports.example.test/verify/NP-LAYO-7K3Q';

async function reportFor(input: PlanInput, extra: Partial<ReportData> = {}): Promise<ReportData> {
  const parsed = parsePlan(input);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  const built = buildRuleSet(editions);
  const evaluation = await evaluate({ jurisdiction: 'layout-test', version: 2, parameters: built.parameters, rules: built.rules }, parsed.plan);
  return {
    code: 'NP-LAYO-7K3Q',
    verifyUrl: VERIFY_URL,
    generatedAt: new Date('2026-12-03T17:42:10Z'),
    project: { name: 'Layout test closet (invented)', siteAddress: '12 Test Lane', permitNumber: 'T-1', isDemo: true },
    organization: { name: 'Test Company', licenseNumber: null },
    jurisdiction: { name: 'Test County', region: 'Test State', editions, amendmentNotes: '', timeZone: 'America/Denver' },
    ruleSet: { version: 2, publishedAt: new Date('2026-11-01T08:00:00Z'), changelog: '' },
    planRevision: { number: 4, savedBy: 'Tester', savedAt: new Date('2026-12-01T09:00:00Z') },
    check: { id: 'c', createdAt: new Date('2026-12-01T09:05:00Z'), runBy: 'Tester', summary: evaluation.summary, outcome: 'fail' },
    findings: evaluation.findings,
    plan: parsed.plan,
    parameters: built.parameters,
    photos: [],
    documents: [],
    preparedBy: 'Tester',
    ...extra,
  };
}

type Line = { y: number; text: string };
type PageText = { lines: Line[]; body: Line[] };

// The footer sits 24 pt above the page's bottom edge; body text ends at the 56 pt bottom padding.
const FOOTER_TOP_PT = 48;

async function pagesOf(pdf: Buffer): Promise<PageText[]> {
  const doc = await getDocumentProxy(new Uint8Array(pdf));
  const pages: PageText[] = [];
  for (let n = 1; n <= doc.numPages; n++) {
    const content = await (await doc.getPage(n)).getTextContent();
    const byY = new Map<number, string[]>();
    for (const item of content.items) {
      if (!('str' in item) || !item.str.trim()) continue;
      const y = Math.round(item.transform[5]);
      byY.set(y, [...(byY.get(y) ?? []), item.str]);
    }
    const lines = [...byY.entries()].sort((a, b) => b[0] - a[0]).map(([y, parts]) => ({ y, text: parts.join(' ').replace(/\s+/g, ' ').trim() }));
    pages.push({ lines, body: lines.filter((l) => l.y > FOOTER_TOP_PT) });
  }
  return pages;
}

const allText = (pages: PageText[]) => pages.flatMap((p) => p.lines.map((l) => l.text)).join(' ');

const fixtures: Array<[string, PlanInput]> = [
  ['hall closet', hallClosetPassPlan],
  ['long exhaust', longExhaustFailPlan],
  ['gas walk-in (metric)', gasWalkInBedroomPlan],
  ['largest allowed', largestAllowedPlan],
];
const rendered = new Map<string, { pages: PageText[]; pageCount: number }>();

beforeAll(async () => {
  for (const [name, plan] of fixtures) {
    const { pdf, pageCount } = await renderReportPdf(await reportFor(plan));
    rendered.set(name, { pages: await pagesOf(pdf), pageCount });
  }
}, 180_000);

describe('report lengths read as the web writes them', () => {
  it('prints hinge positions in feet-inches with millimetres beside, never as decimal inches', () => {
    const text = allText(rendered.get('hall closet')!.pages);
    // Door 78 in high, hinge 27 in up: cup centre 51 in = 4' 3" below the top; 1 in = 25.4 mm exactly (NIST SP 811).
    expect(text).toContain(`4' 3" (1295.4 mm)`);
    // Hinge 75 in up: 3 in below the top.
    expect(text).toContain(`3" (76.2 mm)`);
    // Decimal inches stay only for thin material under an inch (duct wall 0.019 in), as on the web.
    expect(text).not.toMatch(/\b[1-9]\d*\.\d+ in\b/);
  });

  it('prints a metric plan in millimetres', () => {
    const text = allText(rendered.get('gas walk-in (metric)')!.pages);
    // Door 2032 mm high, hinge 560 mm up: 1472 mm below the top.
    expect(text).toContain('1472 mm');
    expect(text).not.toMatch(/\b[1-9]\d*\.\d+ in\b/);
    expect(text).not.toMatch(/\d+(-\d+\/\d+)?" \(/); // no imperial-first lengths on a metric plan
  });

  it('names missing drawing fields by their labels, not their keys', async () => {
    const { pdf } = await renderReportPdf(await reportFor({ ...hallClosetPassPlan, enclosure: { ...hallClosetPassPlan.enclosure, depth: undefined } } as PlanInput));
    const text = allText(await pagesOf(pdf));
    expect(text).not.toContain('enclosure.depth');
    expect(text).toContain('Missing: Enclosure depth');
    expect(text).toContain('left out of this drawing: Enclosure depth');
  });
});

describe('report dates', () => {
  it('prints every date of the report on the jurisdiction’s clock with its abbreviation: issue, check, revision, rule set, citation check, photos', async () => {
    const png = await import('qrcode').then((q) => q.toBuffer('photo', { type: 'png' }));
    const data = await reportFor(hallClosetPassPlan, {
      citationChecks: { 'exhaust.developed-length': { citation: 'IRC 2021 M1502.4.6.1', checkedOn: '2026-11-20T15:04:00.000Z' } },
      photos: [{ caption: 'Rough-in, back wall', filename: 'p1.png', image: png, width: 100, height: 100, addedAt: new Date('2026-11-30T22:10:00Z') }],
      documents: [{ caption: 'Dryer instructions', filename: 'dryer.pdf', contentType: 'application/pdf', addedAt: new Date('2026-11-29T07:00:00Z') }],
    });
    expect(data.jurisdiction.timeZone).toBe('America/Denver');
    const text = allText(await pagesOf((await renderReportPdf(data)).pdf));
    // tz database `northamerica`: America/Denver is UTC-7 (MST) after 2026-11-01 08:00 UTC, when daylight time ends.
    for (const expected of [
      'Dec 3, 2026, 10:42 AM MST (times in America/Denver)', // issued 17:42 UTC
      'Dec 1, 2026, 2:05 AM MST', // check 09:05 UTC
      'Dec 1, 2026, 2:00 AM MST', // revision 09:00 UTC
      'Nov 1, 2026, 1:00 AM MST', // published 08:00 UTC, the first instant of standard time
      'jurisdiction on Nov 20, 2026, MST', // citation checked 15:04 UTC
      'Nov 30, 2026, 3:10 PM MST', // photo 22:10 UTC
      'Nov 29, 2026, 12:00 AM MST', // document 07:00 UTC
    ]) {
      expect(text).toContain(expected);
    }
    // Any date in the text is in the one format and names the zone; nothing is left in UTC or ISO form.
    const dates = text.match(/\b(?:Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec) \d{1,2}, \d{4}[^;)]{0,14}/g) ?? [];
    expect(dates.length).toBeGreaterThanOrEqual(7);
    for (const d of dates) expect(d).toMatch(/^\w{3} \d{1,2}, \d{4}, (?:\d{1,2}:\d{2} [AP]M )?MST/);
    expect(text).not.toMatch(/\d{4}-\d{2}-\d{2}[ T]\d{2}:\d{2}/);
    expect(text).not.toMatch(/\bUTC\b/);
  });

  it('prints a zone with a half-hour offset as such', async () => {
    const data = await reportFor(hallClosetPassPlan);
    data.jurisdiction.timeZone = 'America/St_Johns';
    const text = allText(await pagesOf((await renderReportPdf(data)).pdf));
    // tz database `northamerica`: America/St_Johns is UTC-3:30 in December; 17:42 UTC is 14:12 there.
    expect(text).toContain('Dec 3, 2026, 2:12 PM GMT-3:30 (times in America/St_Johns)');
  });
});

describe('the QR code beside the report code', () => {
  it('decodes to the absolute verification address printed beside it', async () => {
    const { pdf } = await renderReportPdf(await reportFor(hallClosetPassPlan));
    const pages = await pagesOf(pdf);
    expect(allText([pages[0]])).toContain(VERIFY_URL);
    const images = await extractImages(new Uint8Array(pdf), 1);
    const decoded = images.map((img) => {
      const rgba = new Uint8ClampedArray(img.width * img.height * 4);
      for (let i = 0; i < img.width * img.height; i++) {
        for (let c = 0; c < 3; c++) rgba[i * 4 + c] = img.data[i * img.channels + (img.channels >= 3 ? c : 0)];
        rgba[i * 4 + 3] = 255;
      }
      return jsQR(rgba, img.width, img.height)?.data ?? null;
    });
    expect(decoded).toContain(VERIFY_URL);
  });
});

describe('pages carry content', () => {
  const headings = new Set([...Object.values(areaTitles), 'Findings', 'Closet drawings', 'Hinge layout', 'Photos', 'Statement and signatures', 'Documents on file']);

  it.each(fixtures.map(([name]) => name))('%s: every page but the last is at least half used and no page ends on a heading', (name) => {
    const { pages, pageCount } = rendered.get(name)!;
    expect(pages.length).toBe(pageCount);
    // Usable height: 792 pt LETTER less 42 pt top and 56 pt bottom padding.
    const top = 792 - 42;
    const usable = 792 - 42 - 56;
    pages.slice(0, -1).forEach((page, i) => {
      const lowest = Math.min(...page.body.map((l) => l.y));
      const used = (top - lowest) / usable;
      expect.soft(used, `${name} page ${i + 1} of ${pages.length} is ${Math.round(used * 100)} % used`).toBeGreaterThan(0.5);
      expect.soft(page.body.length, `${name} page ${i + 1} lines`).toBeGreaterThan(8);
    });
    pages.forEach((page, i) => {
      const last = page.body.at(-1)!.text;
      expect.soft(headings.has(last) || /^STATUS RULE AND FINDING/i.test(last), `${name} page ${i + 1} ends on "${last}"`).toBe(false);
    });
  });

  it('prints a note the front elevation and the plan view share once', () => {
    const text = allText(rendered.get('hall closet')!.pages);
    expect(text.split('Hinge sides not in the plan are assumed').length - 1).toBe(1);
  });

  it('the demo hall-closet report is shorter than the 9 pages it printed before', () => {
    // Measured on the earlier layout: 9 pages (cover, five of findings, drawings, hinges, statement).
    expect(rendered.get('hall closet')!.pageCount).toBeLessThanOrEqual(8);
  });
});
