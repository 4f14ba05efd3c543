import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, newInstallerCompany, postJson, signIn } from './helpers';

/*
 * The projects list gives each project its latest check's counts and where it stands with the
 * inspector, apart: a check that passes can still have been sent back with corrections.
 */

const db = appDb();
let inspector: string;

beforeAll(async () => {
  inspector = await signIn('inspector@nookpass.demo');
});
afterAll(async () => {
  await db.destroy();
});

async function listed(cookie: string, name: string) {
  const res = await api(`/api/projects?q=${encodeURIComponent(name)}`, { cookie });
  expect(res.status).toBe(200);
  const item = res.body.items.find((i: { name: string }) => i.name === name);
  expect(item, `${name} is listed`).toBeTruthy();
  return item;
}

describe('projects list: check counts and inspection outcome', () => {
  it('lists the latest check’s counts and follows the report from not sent to the inspector’s outcome', { timeout: 240_000 }, async () => {
    const company = await newInstallerCompany(db, 'list-status');
    const name = `List status ${randomBytes(3).toString('hex')} (test)`;
    const p = await api('/api/projects', postJson({ name, siteAddress: '3 Column Court', jurisdiction: 'demo-county' }, { cookie: company.cookie }));
    expect(p.status).toBe(201);
    expect(await listed(company.cookie, name)).toMatchObject({ latestCheck: null, inspection: { status: 'not-sent', reportCode: null } });

    expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: company.cookie }))).status).toBe(201);
    const check = await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie: company.cookie }));
    expect(check.status).toBe(201);
    const s = check.body.summary;
    let item = await listed(company.cookie, name);
    expect(item.latestCheck.summary).toMatchObject({ fail: s.fail, needsInfo: s.needsInfo, caution: s.caution, pass: s.pass });
    expect(item.inspection.status).toBe('not-sent');

    // A copy to another address is not a send to the inspector.
    const other = await api(`/api/checks/${check.body.id}/send`, postJson({ to: `copy-${randomBytes(3).toString('hex')}@example.test`, confirm: true }, { cookie: company.cookie }));
    expect(other.status, JSON.stringify(other.body)).toBe(201);
    expect((await listed(company.cookie, name)).inspection.status).toBe('not-sent');

    const sent = await api(`/api/checks/${check.body.id}/send`, postJson({}, { cookie: company.cookie }));
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    item = await listed(company.cookie, name);
    expect(item.inspection).toMatchObject({ status: 'awaiting-inspector', reportCode: sent.body.report.code });

    const reportId = (await db.selectFrom('reports').select('id').where('code', '=', sent.body.report.code).executeTakeFirstOrThrow()).id;
    const review = await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'corrections-needed', comment: 'Add the length label.' }, { cookie: inspector }));
    expect(review.status, JSON.stringify(review.body)).toBeLessThan(300);
    item = await listed(company.cookie, name);
    // The check passes on its own terms; the inspector's word is a column of its own.
    expect(item.latestCheck.outcome).toBe(check.body.outcome);
    expect(item.inspection).toMatchObject({ status: 'corrections-needed', reportCode: sent.body.report.code });

    // A later failing check changes the counts, not the inspection outcome.
    expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan: longExhaustFailPlan }, { cookie: company.cookie }))).status).toBe(201);
    const failing = await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie: company.cookie }));
    item = await listed(company.cookie, name);
    expect(item.latestCheck.summary.fail).toBe(failing.body.summary.fail);
    expect(item.latestCheck.summary.fail).toBeGreaterThan(0);
    expect(item.inspection.status).toBe('corrections-needed');
  });
});
