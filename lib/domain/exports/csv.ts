import { stringify } from 'csv-stringify/sync';
import type { Finding } from '@/lib/domain/engine';
import type { CheckOutcome } from '@/lib/domain/checks/outcome';
import { areaTitles, citationText, findingStatusLabels } from '@/lib/domain/vocabulary';

/**
 * OWASP "CSV Injection": a cell a spreadsheet would read as a formula (starting with = + - @, tab or carriage
 * return) is written with a leading apostrophe so it is shown as text, never run.
 */
const FORMULA_START = /^[=+\-@\t\r]/;

export function neutraliseCell(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return '';
  const text = String(value);
  return FORMULA_START.test(text) ? `'${text}` : text;
}

function toCsv(header: readonly string[], rows: ReadonlyArray<ReadonlyArray<string | number | boolean | null | undefined>>): string {
  // RFC 4180 §2: CRLF between records; the header line names the columns.
  return stringify([[...header], ...rows.map((row) => row.map(neutraliseCell))], { record_delimiter: '\r\n', bom: true });
}

/** What an exported project row needs; the projects list's own item type has more. */
export type ProjectExportRow = {
  name: string;
  siteAddress: string;
  jurisdiction: { name: string };
  permitNumber: string | null;
  isDemo: boolean;
  archivedAt: Date | string | null;
  updatedAt: Date | string;
  latestRevision: number | null;
  latestCheck: { outcome: CheckOutcome; createdAt: Date | string } | null;
};

export const PROJECTS_CSV_HEADER = ['Project', 'Site address', 'Jurisdiction', 'Permit number', 'Latest check', 'Latest check at', 'Plan revision', 'Updated', 'Archived', 'Demo'] as const;

const outcomeText: Record<CheckOutcome, string> = { pass: 'Passes', fail: 'Has failures', incomplete: 'Incomplete' };

const iso = (d: Date | string | null | undefined) => (d ? new Date(d).toISOString() : '');

export function projectsCsv(projects: readonly ProjectExportRow[]): string {
  return toCsv(
    PROJECTS_CSV_HEADER,
    projects.map((p) => [
      p.name,
      p.siteAddress,
      p.jurisdiction.name,
      p.permitNumber ?? '',
      p.latestCheck ? outcomeText[p.latestCheck.outcome] : 'Not checked yet',
      iso(p.latestCheck?.createdAt),
      p.latestRevision ?? '',
      iso(p.updatedAt),
      p.archivedAt ? 'yes' : 'no',
      p.isDemo ? 'yes' : 'no',
    ]),
  );
}

export const FINDINGS_CSV_HEADER = ['Rule', 'Title', 'Area', 'Section cited', 'Status', 'Message', 'Remedy', 'Measured', 'Limit'] as const;

export function findingsCsv(findings: readonly Finding[]): string {
  return toCsv(
    FINDINGS_CSV_HEADER,
    findings.map((f) => [
      f.ruleKey,
      f.title,
      areaTitles[f.area] ?? f.area,
      citationText(f.citation),
      findingStatusLabels[f.status]?.label ?? f.status,
      f.message,
      f.remedy ?? '',
      f.display?.measured ?? '',
      f.display?.limit ?? '',
    ]),
  );
}

/** A file name safe in any file system: the name's letters and digits, dashes between. */
export function csvFileName(...parts: string[]): string {
  const slug = parts
    .join(' ')
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .trim()
    .replace(/[\s_-]+/g, '-')
    .toLowerCase()
    .slice(0, 80);
  return `${slug || 'export'}.csv`;
}
