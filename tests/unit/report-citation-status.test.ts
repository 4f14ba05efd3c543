import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { extractText, getDocumentProxy } from 'unpdf';
import { describe, expect, it } from 'vitest';
import { FindingsList } from '@/components/checks/findings-list';
import { evaluate } from '@/lib/domain/engine';
import { parsePlan } from '@/lib/domain/plan';
import type { ReportData } from '@/lib/domain/reports/report-data';
import { checkedOnFor, citationStatusText, markHolds, uncheckedMemoryCitations } from '@/lib/domain/rule-sets/citation-checks';
import { citationText } from '@/lib/domain/vocabulary';
import { formatDate } from '@/lib/domain/dates/format';
import { renderReportPdf } from '@/lib/platform/pdf/render';
import { buildRuleSet } from '@/rules';
import { longExhaustFailPlan } from '@/tests/fixtures/plans';

const editions = { building: 'IRC 2018', electrical: 'NEC 2017', plumbing: 'IPC 2018', plumbingFamily: 'IPC' as const, mechanical: 'IMC 2018', fuelGas: 'IFGC 2018' };
const built = buildRuleSet(editions);
const CHECKED = 'checked against the adopted code by the jurisdiction on Nov 20, 2026, UTC';
const NOT_CHECKED = 'not yet checked by the jurisdiction';

// The demo route's developed length is cited to IRC 2018 M1502.4.5.1 (TRADE.md, dryer exhaust, V).
const lengthRule = built.rules.find((r) => r.key === 'exhaust.developed-length')!;
const checks = { 'exhaust.developed-length': { citation: 'IRC 2018 M1502.4.5.1', checkedOn: '2026-11-20T15:04:00.000Z' } };

describe('a citation’s status in the inspector’s terms', () => {
  it('says checked with the date, or not yet checked; never the confidence letters', () => {
    const utcDay = (at: Date | string) => formatDate(at, 'UTC');
    expect(citationStatusText(lengthRule.citation, '2026-11-20T15:04:00.000Z', utcDay)).toBe(CHECKED);
    // tz database `australasia`: Pacific/Auckland is UTC+13 in November, already the next day.
    expect(citationStatusText(lengthRule.citation, '2026-11-20T15:04:00.000Z', (at) => formatDate(at, 'Pacific/Auckland'))).toMatch(/on Nov 21, 2026, GMT\+13$/);
    expect(citationStatusText(lengthRule.citation, null, utcDay)).toBe(NOT_CHECKED);
    expect(citationStatusText({ code: 'common practice', edition: null, section: null }, null, utcDay)).toBe('common practice, not a code section');
  });

  it('a mark holds only for the citation it checked: a re-cited rule is unchecked again', () => {
    expect(markHolds({ checked: true, citation: 'IRC 2018 M1502.4.5.1' }, lengthRule.citation)).toBe(true);
    expect(markHolds({ checked: true, citation: 'IRC 2015 M1502.4.4.1' }, lengthRule.citation)).toBe(false);
    expect(markHolds({ checked: false, citation: 'IRC 2018 M1502.4.5.1' }, lengthRule.citation)).toBe(false);
    expect(checkedOnFor({ ruleKey: 'exhaust.developed-length', citation: { code: 'IRC', edition: '2015', section: 'M1502.4.4.1' } }, checks)).toBeNull();
  });

  it('lists the enabled from-memory citations nobody checked', () => {
    const memory = built.rules.filter((r) => r.enabled && r.confidence === 'M');
    expect(memory.length).toBeGreaterThan(0); // e.g. the washer trap, IRC Table P3201.7 (TRADE.md: M)
    const all = uncheckedMemoryCitations(built.rules, new Map());
    expect(all.map((u) => u.ruleKey).sort()).toEqual(memory.map((r) => r.key).sort());
    const first = memory[0];
    const marks = new Map([[first.key, { checked: true, citation: citationText(first.citation) }]]);
    expect(uncheckedMemoryCitations(built.rules, marks).map((u) => u.ruleKey)).not.toContain(first.key);
    const disabled = built.rules.map((r) => (r.key === first.key ? { ...r, enabled: false } : r));
    expect(uncheckedMemoryCitations(disabled, new Map()).map((u) => u.ruleKey)).not.toContain(first.key);
  });
});

async function findings() {
  const parsed = parsePlan(longExhaustFailPlan);
  if (!parsed.ok) throw new Error('fixture must parse');
  return { plan: parsed.plan, evaluation: await evaluate({ jurisdiction: 'test-county', version: 3, ...built }, parsed.plan) };
}

describe('reports never say "from memory"', () => {
  it('the PDF gives each citation its checked status', async () => {
    const { plan, evaluation } = await findings();
    expect(evaluation.findings.some((f) => f.confidence === 'M')).toBe(true); // there is something to hide
    const data: ReportData = {
      code: 'NP-TEST-2345', verifyUrl: 'http://127.0.0.1/verify/NP-TEST-2345', generatedAt: new Date('2026-12-02T10:00:00Z'),
      project: { name: 'Test closet', siteAddress: '1 Test Street', permitNumber: null, isDemo: true },
      organization: { name: 'Test Company', licenseNumber: null },
      jurisdiction: { name: 'Test County', region: 'Test State', editions, amendmentNotes: '', timeZone: 'UTC' },
      ruleSet: { version: 3, publishedAt: new Date('2026-11-21T00:00:00Z'), changelog: 'Test version' },
      planRevision: { number: 1, savedBy: 'Tester', savedAt: new Date('2026-12-01T09:00:00Z') },
      check: { id: 'c', createdAt: new Date('2026-12-01T09:05:00Z'), runBy: 'Tester', summary: evaluation.summary, outcome: 'fail' },
      findings: evaluation.findings, plan, parameters: built.parameters, photos: [], documents: [], preparedBy: 'Tester',
      citationChecks: checks,
    };
    const { pdf } = await renderReportPdf(data);
    const doc = await getDocumentProxy(new Uint8Array(pdf));
    const text = (await extractText(doc, { mergePages: true })).text.replace(/\s+/g, ' ');
    expect(text).toContain(CHECKED);
    expect(text).toContain(NOT_CHECKED);
    expect(text).not.toMatch(/from memory/i);
    expect(text).not.toMatch(/confidence [VSM]/);
  });

  it('the web report (the inspector’s findings list) does too', async () => {
    const { evaluation } = await findings();
    const html = renderToStaticMarkup(createElement(FindingsList, { findings: evaluation.findings, citationChecks: checks }));
    expect(html).toContain(CHECKED);
    expect(html).toContain(NOT_CHECKED);
    expect(html).not.toMatch(/from memory/i);
    // Installers and admins still see the source confidence where no report is shown.
    const plain = renderToStaticMarkup(createElement(FindingsList, { findings: evaluation.findings }));
    expect(plain).not.toContain(NOT_CHECKED);
  });
});
