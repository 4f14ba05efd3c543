import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, newInstallerCompany, postJson, signIn } from './helpers';

/*
 * A report says what it said when issued: after the project is renamed, given another address and
 * permit number and moved to another jurisdiction, the verification page, its API, the inspector's
 * queue and the inspection page still show the issued values.
 */

const db = appDb();
const tag = randomBytes(3).toString('hex');
const issued = { name: `Snapshot closet ${tag} (test)`, siteAddress: `${tag} Issued Street`, permitNumber: `BP-${tag}` };
const later = { name: `Renamed later ${tag}`, siteAddress: `${tag} Elsewhere Avenue`, permitNumber: `BP-LATER-${tag}` };
let installer: string;
let companyName: string;
let inspector: string;
let code: string;
let reportId: string;
// Lookups from an address of this file's own (RFC 3849), as the nearest proxy would forward it.
const client = `2001:db8:5::${randomBytes(2).toString('hex')}`;

const text = (html: string) => html.replace(/<!-- -->/g, '');

beforeAll(async () => {
  const company = await newInstallerCompany(db, 'snapshot');
  installer = company.cookie;
  companyName = company.organizationName;
  inspector = await signIn('inspector@nookpass.demo');
  const p = await api('/api/projects', postJson({ ...issued, jurisdiction: 'demo-county' }, { cookie: installer }));
  expect(p.status).toBe(201);
  expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan: longExhaustFailPlan }, { cookie: installer }))).status).toBe(201);
  const checkId = (await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie: installer }))).body.id;
  const sent = await api(`/api/checks/${checkId}/send`, postJson({ confirmFailingFindings: true }, { cookie: installer }));
  expect(sent.status, JSON.stringify(sent.body)).toBe(201);
  code = sent.body.report.code;
  reportId = (await db.selectFrom('reports').select('id').where('code', '=', code).executeTakeFirstOrThrow()).id;
  const moved = await api(`/api/projects/${p.body.id}`, postJson({ ...later, jurisdiction: 'demo-city' }, { cookie: installer, method: 'PATCH' }));
  expect(moved.status, JSON.stringify(moved.body)).toBe(200);
}, 60_000);

afterAll(async () => {
  await db.destroy();
});

describe('an issued report after its project changed', () => {
  it('is stored with the values it was issued with', async () => {
    const row = await db.selectFrom('reports').select('snapshot').where('id', '=', reportId).executeTakeFirstOrThrow();
    expect(row.snapshot).toMatchObject({
      schemaVersion: 1,
      project: { name: issued.name, siteAddress: issued.siteAddress, permitNumber: issued.permitNumber, isDemo: false },
      jurisdiction: { slug: 'demo-county', name: 'Demo County' },
      company: { name: companyName },
      ruleSet: { version: expect.any(Number) },
      check: { checkedAt: expect.any(String), outcome: 'fail', summary: { fail: expect.any(Number) } },
    });
  });

  it('shows the issued values on the verification API and page', async () => {
    const facts = await api(`/api/reports/${code}`, { headers: { 'x-forwarded-for': client } });
    expect(facts.status).toBe(200);
    expect(facts.body).toMatchObject({ code, projectName: issued.name, siteAddress: issued.siteAddress, jurisdiction: 'Demo County', asIssued: true });
    const html = text(await (await fetch(`${baseUrl}/verify/${code}`, { headers: { 'x-forwarded-for': client } })).text());
    expect(html).toContain(issued.name);
    expect(html).toContain(issued.siteAddress);
    expect(html).toContain('Demo County');
    expect(html).not.toContain(later.name);
    expect(html).not.toContain(later.siteAddress);
    expect(html).not.toContain('verify-not-as-issued');
  });

  it('shows the issued values in the inspector queue and on the inspection page', async () => {
    const queue = await api(`/api/inspections?q=${code}`, { cookie: inspector });
    const row = queue.body.inspections.find((i: { code: string }) => i.code === code);
    expect(row).toMatchObject({ projectName: issued.name, siteAddress: issued.siteAddress, organizationName: companyName, asIssued: true });
    const list = text(await (await fetch(`${baseUrl}/inspections?q=${code}`, { headers: { cookie: inspector } })).text());
    expect(list).toContain(issued.name);
    expect(list).not.toContain(later.name);
    const detail = await api(`/api/inspections/${reportId}`, { cookie: inspector });
    expect(detail.body.project).toMatchObject({ name: issued.name, siteAddress: issued.siteAddress, permitNumber: issued.permitNumber, jurisdictionName: 'Demo County' });
    const page = text(await (await fetch(`${baseUrl}/inspections/${reportId}`, { headers: { cookie: inspector } })).text());
    expect(page).toContain(issued.name);
    expect(page).toContain(`permit ${issued.permitNumber}`);
    expect(page).not.toContain(later.name);
    expect(page).not.toContain(later.permitNumber);
  });
});
