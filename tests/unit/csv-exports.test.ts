import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { csvFileName, findingsCsv, neutraliseCell, projectsCsv, PROJECTS_CSV_HEADER } from '@/lib/domain/exports/csv';
import type { Finding } from '@/lib/domain/engine';

describe('CSV cells a spreadsheet would run', () => {
  // OWASP CSV Injection: cells starting with = + - @, tab or carriage return are made text with a leading apostrophe.
  it.each(['=1+1', '+1 555', '-2+3', '@SUM(A1)', '\tx', '\rx'])('prefixes %j', (text) => {
    expect(neutraliseCell(text)).toBe(`'${text}`);
  });
  it.each(['plain', '1=1', " 'quoted", '', 'a-b'])('leaves %j alone', (text) => {
    expect(neutraliseCell(text)).toBe(text);
  });
  it('writes numbers and blanks as text without a prefix unless negative', () => {
    expect(neutraliseCell(3)).toBe('3');
    expect(neutraliseCell(-3)).toBe("'-3");
    expect(neutraliseCell(null)).toBe('');
  });
});

describe('projects CSV', () => {
  it('quotes commas, quotes and line breaks so csv-parse reads the cells back (RFC 4180 §2)', () => {
    const text = projectsCsv([
      { name: 'A "quoted", name', siteAddress: 'Line 1\nLine 2', jurisdiction: { name: 'Demo County' }, permitNumber: null, isDemo: true, archivedAt: null, updatedAt: '2026-12-01T10:00:00.000Z', latestRevision: 2, latestCheck: { outcome: 'incomplete', createdAt: '2026-12-01T09:00:00.000Z' } },
    ]);
    expect(text.startsWith('\uFEFF')).toBe(true);
    expect(text).toContain('\r\n');
    const [header, row] = parse(text, { bom: true }) as string[][];
    expect(header).toEqual([...PROJECTS_CSV_HEADER]);
    expect(row).toEqual(['A "quoted", name', 'Line 1\nLine 2', 'Demo County', '', 'Incomplete', '2026-12-01T09:00:00.000Z', '2', '2026-12-01T10:00:00.000Z', 'no', 'yes']);
  });
});

describe('findings CSV', () => {
  it('names the rule, the section cited, the status, the message and the remedy', () => {
    const finding = {
      ruleKey: 'exhaust.developed-length', title: 'Developed length', area: 'exhaust', status: 'fail', citation: { code: 'IRC', edition: '2021', section: 'M1502.4.5.1' },
      message: '-5 ft over', remedy: '=remove an elbow', display: { measured: '40 ft', limit: '35 ft' },
    } as unknown as Finding;
    const [, row] = parse(findingsCsv([finding]), { bom: true }) as string[][];
    expect(row).toEqual(['exhaust.developed-length', 'Developed length', 'Dryer exhaust', 'IRC 2021 M1502.4.5.1', 'Fails', "'-5 ft over", "'=remove an elbow", '40 ft', '35 ft']);
  });
});

describe('export file names', () => {
  it('keep letters, digits and dashes only', () => {
    expect(csvFileName('check', 'demo-county', 'v3', '2026-12-01', 'findings')).toBe('check-demo-county-v3-2026-12-01-findings.csv');
    expect(csvFileName('../../etc/passwd "x"')).toBe('etcpasswd-x.csv');
    expect(csvFileName('')).toBe('export.csv');
  });
});
