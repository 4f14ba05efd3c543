import { parse as parseDisposition } from 'content-disposition';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, postJson, signIn } from './helpers';

const db = appDb();
let installer: string; // Demo Closet Works
let other: string; // Demo Second Company
let inspector: string;
const tag = `csvit${Math.random().toString(36).slice(2, 8)}`;
let projectId: string;
let checkId: string;

async function download(path: string, cookie?: string) {
  const res = await fetch(`${baseUrl}${path}`, { headers: cookie ? { cookie } : {}, redirect: 'manual' });
  return { status: res.status, headers: res.headers, text: await res.text() };
}

function rows(text: string): Record<string, string>[] {
  return parse(text, { bom: true, columns: true, skip_empty_lines: true });
}

beforeAll(async () => {
  [installer, other, inspector] = await Promise.all([signIn('installer@nookpass.demo'), signIn('other-installer@nookpass.demo'), signIn('inspector@nookpass.demo')]);
  // Cells a spreadsheet would run as formulas (OWASP CSV Injection): = + - @.
  const created = await api('/api/projects', postJson({ name: `=HYPERLINK("http://x.invalid","${tag}")`, siteAddress: '+1 Formula Road (demo)', permitNumber: '@SUM(A1)', notes: 'demo', jurisdiction: 'demo-county' }, { cookie: installer }));
  expect(created.status).toBe(201);
  projectId = created.body.id;
  expect((await api(`/api/projects/${projectId}/plans`, postJson({ plan: longExhaustFailPlan }, { cookie: installer }))).status).toBe(201);
  const check = await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }));
  expect(check.status).toBe(201);
  checkId = check.body.id;
  for (const name of [`${tag} b-second`, `${tag} a-first`]) {
    expect((await api('/api/projects', postJson({ name, siteAddress: '3 Export Street (demo)', jurisdiction: 'demo-county' }, { cookie: installer }))).status).toBe(201);
  }
  const archived = await api('/api/projects', postJson({ name: `${tag} c-archived`, siteAddress: '3 Export Street (demo)', jurisdiction: 'demo-county' }, { cookie: installer }));
  expect((await api(`/api/projects/${archived.body.id}`, postJson({ archived: true }, { cookie: installer, method: 'PATCH' }))).status).toBe(200);
  // Another company's project with the same words must never appear in this company's export.
  expect((await api('/api/projects', postJson({ name: `${tag} other company`, siteAddress: '9 Elsewhere (demo)', jurisdiction: 'demo-county' }, { cookie: other }))).status).toBe(201);
}, 120_000);
afterAll(async () => {
  await db.destroy();
});

describe('projects list as CSV', () => {
  it('holds the filtered list in its order, company-scoped, with a file name and the CSV media type', async () => {
    const res = await download(`/api/projects.csv?q=${tag}&sort=name&dir=asc`, installer);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8; header=present'); // RFC 4180 §3
    const disposition = parseDisposition(res.headers.get('content-disposition')!); // RFC 6266
    expect(disposition.type).toBe('attachment');
    expect(disposition.parameters.filename).toMatch(/^projects-\d{4}-\d{2}-\d{2}\.csv$/);
    const parsed = rows(res.text);
    const list = await api(`/api/projects?q=${tag}&sort=name&dir=asc`, { cookie: installer });
    expect(parsed.map((r) => r.Project.replace(/^'/, ''))).toEqual(list.body.items.map((p: { name: string }) => p.name));
    const names = parsed.map((r) => r.Project);
    expect([...names].sort()).toEqual([`'=HYPERLINK("http://x.invalid","${tag}")`, `${tag} a-first`, `${tag} b-second`]);
    expect(names.indexOf(`${tag} a-first`)).toBeLessThan(names.indexOf(`${tag} b-second`));
    const reversed = rows((await download(`/api/projects.csv?q=${tag}&sort=name&dir=desc`, installer)).text).map((r) => r.Project);
    expect(reversed).toEqual([...names].reverse());
    expect(Object.keys(parsed[0])).toEqual(['Project', 'Site address', 'Jurisdiction', 'Permit number', 'Latest check', 'Latest check at', 'Plan revision', 'Updated', 'Archived', 'Demo']);
    expect(res.text).not.toContain('other company');
  });

  it('neutralises formula cells and fills the latest check', async () => {
    const parsed = rows((await download(`/api/projects.csv?q=${encodeURIComponent('HYPERLINK')}`, installer)).text).filter((r) => r.Project.includes(tag));
    expect(parsed).toHaveLength(1);
    expect(parsed[0]['Site address']).toBe("'+1 Formula Road (demo)");
    expect(parsed[0]['Permit number']).toBe("'@SUM(A1)");
    expect(parsed[0]['Latest check']).toBe('Has failures');
    expect(parsed[0]['Plan revision']).toBe('1');
    for (const row of parsed) for (const cell of Object.values(row)) expect(cell).not.toMatch(/^[=+\-@]/);
  });

  it('follows the archived filter of the list', async () => {
    const active = rows((await download(`/api/projects.csv?q=${tag}`, installer)).text).map((r) => r.Project);
    const all = rows((await download(`/api/projects.csv?q=${tag}&archived=all`, installer)).text).map((r) => r.Project);
    expect(active).not.toContain(`${tag} c-archived`);
    expect(all).toContain(`${tag} c-archived`);
  });

  it('refuses bad filters with a 400 naming them, anonymous callers with 401 and inspectors with 403', async () => {
    const bad = await api('/api/projects.csv?sort=colour', { cookie: installer });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path)).toContain('sort');
    expect((await download('/api/projects.csv')).status).toBe(401);
    expect((await download('/api/projects.csv', inspector)).status).toBe(403);
  });
});

describe("a check's findings as CSV", () => {
  it('has one line per finding with rule, section cited, status, message and remedy', async () => {
    const res = await download(`/api/checks/${checkId}/findings.csv`, installer);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8; header=present');
    const disposition = parseDisposition(res.headers.get('content-disposition')!);
    expect(disposition.type).toBe('attachment');
    expect(disposition.parameters.filename).toMatch(/^check-demo-county-v\d+-\d{4}-\d{2}-\d{2}-findings\.csv$/);
    const parsed = rows(res.text);
    const check = await api(`/api/checks/${checkId}`, { cookie: installer });
    expect(parsed).toHaveLength(check.body.findings.length);
    expect(Object.keys(parsed[0])).toEqual(['Rule', 'Title', 'Area', 'Section cited', 'Status', 'Message', 'Remedy', 'Measured', 'Limit']);
    const length = parsed.find((r) => r.Rule === 'exhaust.developed-length')!;
    const finding = check.body.findings.find((f: { ruleKey: string }) => f.ruleKey === 'exhaust.developed-length');
    expect(length.Status).toBe('Fails');
    expect(length.Message).toBe(finding.message.replace(/^([=+\-@])/, "'$1"));
    expect(length.Remedy).toBe(finding.remedy ?? '');
    expect(length['Section cited']).toBe([finding.citation.code, finding.citation.edition, finding.citation.section].filter(Boolean).join(' '));
  });

  it("another company's check answers 404, an inspector 403, nobody 401", async () => {
    expect((await download(`/api/checks/${checkId}/findings.csv`, other)).status).toBe(404);
    expect((await download(`/api/checks/${checkId}/findings.csv`, inspector)).status).toBe(403);
    expect((await download(`/api/checks/${checkId}/findings.csv`)).status).toBe(401);
    expect((await download('/api/checks/not-a-uuid/findings.csv', installer)).status).toBe(404);
  });
});
