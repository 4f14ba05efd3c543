import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { searchInspections } from '@/db/reports';
import { hallClosetPassPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, newInstallerCompany, postJson, signIn } from './helpers';

// The inspector's queue: search, outcome and date filters, permit number and site address as issued, pages.
// Other test files send reports to Demo County at the same time, so every assertion narrows to this file's tag.

const db = appDb();
const tag = `q${randomBytes(3).toString('hex')}`;
let installer: string;
let inspector: string;
let countyId: string;
const sent: Record<'approved' | 'corrections' | 'awaiting', { code: string; reportId: string; projectId: string; checkId: string; permit: string; address: string }> = {} as never;

async function sendProject(label: keyof typeof sent, plan: unknown) {
  const permit = `BP-${tag}-${label}`.toUpperCase();
  const address = `${label === 'approved' ? 12 : label === 'corrections' ? 14 : 16} ${tag} Lane`;
  const p = await api('/api/projects', postJson({ name: `Queue ${label} ${tag} (test)`, siteAddress: address, permitNumber: permit, jurisdiction: 'demo-county' }, { cookie: installer }));
  expect(p.status).toBe(201);
  expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan }, { cookie: installer }))).status).toBe(201);
  const checkId = (await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie: installer }))).body.id;
  const res = await api(`/api/checks/${checkId}/send`, postJson({ to: 'inspector@nookpass.demo', confirmFailingFindings: true }, { cookie: installer }));
  expect(res.status).toBe(201);
  const code = res.body.report.code as string;
  const reportId = (await db.selectFrom('reports').select('id').where('code', '=', code).executeTakeFirstOrThrow()).id;
  sent[label] = { code, reportId, projectId: p.body.id, checkId, permit, address };
}

const codes = (body: { inspections: Array<{ code: string }> }) => body.inspections.map((i) => i.code).sort();
const queue = (query: string) => api(`/api/inspections?${query}`, { cookie: inspector });

beforeAll(async () => {
  ({ cookie: installer } = await newInstallerCompany(db, `queue ${tag}`));
  inspector = await signIn('inspector@nookpass.demo');
  countyId = (await db.selectFrom('jurisdictions').select('id').where('slug', '=', 'demo-county').executeTakeFirstOrThrow()).id;
  await sendProject('approved', hallClosetPassPlan);
  await sendProject('corrections', longExhaustFailPlan);
  await sendProject('awaiting', hallClosetPassPlan);
  expect((await api(`/api/inspections/${sent.approved.reportId}/review`, postJson({ outcome: 'approved' }, { cookie: inspector }))).status).toBe(201);
  expect((await api(`/api/inspections/${sent.corrections.reportId}/review`, postJson({ outcome: 'corrections-needed', comment: 'Shorten the run.' }, { cookie: inspector }))).status).toBe(201);
}, 120_000);
afterAll(async () => {
  await db.destroy();
});

describe('the inspections queue', () => {
  it('lists the permit number and site address of each report', async () => {
    const res = await queue(`q=${tag}`);
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(3);
    const row = res.body.inspections.find((i: { code: string }) => i.code === sent.corrections.code);
    expect(row).toMatchObject({ permitNumber: sent.corrections.permit, siteAddress: sent.corrections.address, reviewOutcome: 'corrections-needed', asIssued: true });
  });

  it('finds a report by its code (also typed without dashes), project name, site address, permit number and company', async () => {
    expect(codes((await queue(`q=${encodeURIComponent(sent.awaiting.code.toLowerCase())}`)).body)).toEqual([sent.awaiting.code]);
    expect(codes((await queue(`q=${sent.awaiting.code.replace(/-/g, '')}`)).body)).toEqual([sent.awaiting.code]);
    expect(codes((await queue(`q=${encodeURIComponent(`Queue approved ${tag}`)}`)).body)).toEqual([sent.approved.code]);
    expect(codes((await queue(`q=${encodeURIComponent(`14 ${tag} lane`)}`)).body)).toEqual([sent.corrections.code]);
    expect(codes((await queue(`q=${encodeURIComponent(sent.approved.permit.toLowerCase())}`)).body)).toEqual([sent.approved.code]);
    expect((await queue(`q=${encodeURIComponent(`IT queue ${tag}`)}`)).body.total).toBe(3);
    // A % typed into the search is a percent sign, not "anything".
    expect((await queue(`q=${encodeURIComponent(`${tag}%Lane`)}`)).body.total).toBe(0);
  });

  it('filters by outcome', async () => {
    expect(codes((await queue(`q=${tag}&outcome=awaiting`)).body)).toEqual([sent.awaiting.code]);
    expect(codes((await queue(`q=${tag}&outcome=approved`)).body)).toEqual([sent.approved.code]);
    expect(codes((await queue(`q=${tag}&outcome=corrections-needed`)).body)).toEqual([sent.corrections.code]);
  });

  it('filters by the day received (UTC, both ends included)', async () => {
    const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);
    // The sends were made moments ago; near midnight UTC "today" may have become tomorrow, so allow a day either side.
    expect((await queue(`q=${tag}&from=${day(-1)}&to=${day(1)}`)).body.total).toBe(3);
    expect((await queue(`q=${tag}&from=${day(2)}`)).body.total).toBe(0);
    expect((await queue(`q=${tag}&to=${day(-2)}`)).body.total).toBe(0);
  });

  it('answers a bad filter with a 400 naming the field, not a 500', async () => {
    const badDate = await queue('from=2026-02-30');
    expect(badDate.status).toBe(400);
    expect(badDate.body.errors).toEqual([{ path: 'from', message: expect.stringContaining('Received from') }]);
    const reversed = await queue('from=2026-03-02&to=2026-03-01');
    expect(reversed.status).toBe(400);
    expect(reversed.body.errors[0].path).toBe('to');
    expect((await queue('outcome=maybe')).body.errors[0].path).toBe('outcome');
    expect((await queue('page=0')).body.errors[0].path).toBe('page');
    expect((await queue(`q=${'x'.repeat(201)}`)).body.errors[0].path).toBe('q');
  });

  it('shows the page with a message naming the bad field, and still lists', async () => {
    const res = await fetch(`${baseUrl}/inspections?q=${tag}&from=not-a-date`, { headers: { cookie: inspector } });
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain('Received from: give a date as YYYY-MM-DD.');
    expect(html).toContain(sent.awaiting.code);
    const filtered = await (await fetch(`${baseUrl}/inspections?q=${tag}&outcome=approved`, { headers: { cookie: inspector } })).text();
    expect(filtered).toContain(sent.approved.code);
    expect(filtered).not.toContain(sent.awaiting.code);
    expect(filtered).toContain(sent.approved.permit);
  });

  it('shows the permit number as issued after the project changes it', async () => {
    const res = await api(`/api/projects/${sent.awaiting.projectId}`, { method: 'PATCH', cookie: installer, headers: { 'content-type': 'application/json' }, body: JSON.stringify({ permitNumber: `CHANGED-${tag}` }) });
    expect(res.status).toBe(200);
    const row = (await queue(`q=${sent.awaiting.code}`)).body.inspections[0];
    expect(row.permitNumber).toBe(sent.awaiting.permit);
    expect((await queue(`q=CHANGED-${tag}`)).body.total).toBe(0);
  });

  it('pages in SQL: newest send first, no report twice, the count of all matches', async () => {
    const first = await searchInspections(db, { jurisdictionId: countyId, q: tag, pageSize: 2, page: 1 });
    const second = await searchInspections(db, { jurisdictionId: countyId, q: tag, pageSize: 2, page: 2 });
    expect(first.total).toBe(3);
    expect(first.items).toHaveLength(2);
    expect(second.items).toHaveLength(1);
    const all = [...first.items, ...second.items];
    expect(new Set(all.map((i) => i.code)).size).toBe(3);
    expect(all.map((i) => +i.sentAt)).toEqual([...all.map((i) => +i.sentAt)].sort((a, b) => b - a));
    expect(all.map((i) => i.code)[2]).toBe(sent.approved.code);
  });
});
