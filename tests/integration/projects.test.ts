import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, postJson, signIn } from './helpers';

const db = appDb();
let installer: string; // Demo Closet Works
let colleague: string; // Demo Closet Works
let other: string; // Demo Second Company
let inspector: string;
let admin: string;

beforeAll(async () => {
  [installer, colleague, other, inspector, admin] = await Promise.all([
    signIn('installer@nookpass.demo'),
    signIn('installer2@nookpass.demo'),
    signIn('other-installer@nookpass.demo'),
    signIn('inspector@nookpass.demo'),
    signIn('admin@nookpass.demo'),
  ]);
});
afterAll(async () => {
  await db.destroy();
});

async function newProject(cookie: string, name = `IT project ${Math.random().toString(36).slice(2)}`) {
  const res = await api('/api/projects', postJson({ name, siteAddress: '5 Integration Way', jurisdiction: 'demo-county' }, { cookie }));
  expect(res.status).toBe(201);
  return res.body;
}

describe('projects API', () => {
  it('creates, reads, updates, archives and restores a project', async () => {
    const p = await newProject(installer, 'IT lifecycle project');
    expect(p).toMatchObject({ name: 'IT lifecycle project', jurisdiction: { slug: 'demo-county' }, archivedAt: null, latestCheck: null });
    const read = await api(`/api/projects/${p.id}`, { cookie: installer });
    expect(read.status).toBe(200);
    const upd = await api(`/api/projects/${p.id}`, postJson({ siteAddress: '6 Integration Way', permitNumber: 'B-123' }, { cookie: installer, method: 'PATCH' }));
    expect(upd.status).toBe(200);
    expect(upd.body).toMatchObject({ siteAddress: '6 Integration Way', permitNumber: 'B-123' });

    const archived = await api(`/api/projects/${p.id}`, postJson({ archived: true }, { cookie: colleague, method: 'PATCH' }));
    expect(archived.body.archivedAt).not.toBeNull();
    const list = await api('/api/projects?q=IT%20lifecycle', { cookie: installer });
    expect(list.body.items.map((i: { id: string }) => i.id)).not.toContain(p.id);
    const withArchived = await api('/api/projects?q=IT%20lifecycle&archived=all', { cookie: installer });
    expect(withArchived.body.items.map((i: { id: string }) => i.id)).toContain(p.id);
    const restored = await api(`/api/projects/${p.id}`, postJson({ archived: false }, { cookie: installer, method: 'PATCH' }));
    expect(restored.body.archivedAt).toBeNull();

    const audit = await db.selectFrom('audit_log').select('action').where('entity_id', '=', p.id).orderBy('id').execute();
    expect(audit.map((a) => a.action)).toEqual(['project.create', 'project.update', 'project.archive', 'project.restore']);
  });

  it('names the field on bad input', async () => {
    const res = await api('/api/projects', postJson({ name: '', siteAddress: 'x', jurisdiction: 'nowhere' }, { cookie: installer }));
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { path: string }) => e.path)).toEqual(expect.arrayContaining(['name', 'siteAddress']));
    const unknownJ = await api('/api/projects', postJson({ name: 'A', siteAddress: 'Some street', jurisdiction: 'nowhere' }, { cookie: installer }));
    expect(unknownJ.status).toBe(400);
    expect(unknownJ.body.errors[0]).toMatchObject({ path: 'jurisdiction' });
    const badQuery = await api('/api/projects?sort=password', { cookie: installer });
    expect(badQuery.status).toBe(400);
    expect(badQuery.body.errors[0].path).toBe('sort');
  });

  it('searches, sorts and pages', async () => {
    const tag = `pg${Date.now()}`;
    for (const n of ['b', 'a', 'c']) await newProject(installer, `${tag} ${n}`);
    const asc = await api(`/api/projects?q=${tag}&sort=name&dir=asc&pageSize=2`, { cookie: installer });
    expect(asc.body.total).toBe(3);
    expect(asc.body.items.map((i: { name: string }) => i.name)).toEqual([`${tag} a`, `${tag} b`]);
    const page2 = await api(`/api/projects?q=${tag}&sort=name&dir=asc&pageSize=2&page=2`, { cookie: installer });
    expect(page2.body.items.map((i: { name: string }) => i.name)).toEqual([`${tag} c`]);
    // LIKE wildcards in the search are literal text.
    const wild = await api(`/api/projects?q=${encodeURIComponent('%_%')}`, { cookie: installer });
    expect(wild.status).toBe(200);
    expect(wild.body.items.every((i: { name: string }) => i.name.includes('%_%'))).toBe(true);
  });
});

describe('the organization boundary', () => {
  it('keeps another company’s projects, plans and checks out of reach', async () => {
    const p = await newProject(installer);
    await api(`/api/projects/${p.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }));
    const check = await api(`/api/projects/${p.id}/checks`, postJson({}, { cookie: installer }));
    expect(check.status).toBe(201);

    for (const [path, method] of [
      [`/api/projects/${p.id}`, 'GET'],
      [`/api/projects/${p.id}/plans`, 'GET'],
      [`/api/projects/${p.id}/plans/latest`, 'GET'],
      [`/api/projects/${p.id}/checks`, 'GET'],
      [`/api/checks/${check.body.id}`, 'GET'],
    ] as const) {
      const res = await api(path, { cookie: other, method });
      expect(res.status, path).toBe(404);
    }
    expect((await api(`/api/projects/${p.id}`, postJson({ name: 'taken over' }, { cookie: other, method: 'PATCH' }))).status).toBe(404);
    expect((await api(`/api/projects/${p.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: other }))).status).toBe(404);
    expect((await api(`/api/projects/${p.id}/checks`, postJson({}, { cookie: other }))).status).toBe(404);

    const otherList = await api('/api/projects?archived=all&pageSize=100', { cookie: other });
    expect(otherList.body.items.map((i: { id: string }) => i.id)).not.toContain(p.id);
    expect(otherList.body.items.every((i: { organizationName: string }) => i.organizationName === 'Demo Second Company')).toBe(true);

    // A colleague in the same company and an admin can read it; an inspector cannot reach projects at all.
    expect((await api(`/api/projects/${p.id}`, { cookie: colleague })).status).toBe(200);
    expect((await api(`/api/projects/${p.id}`, { cookie: admin })).status).toBe(200);
    expect((await api(`/api/projects/${p.id}`, { cookie: inspector })).status).toBe(403);
    expect((await api('/api/projects', { cookie: inspector })).status).toBe(403);
  });

  it('lets admins list every company’s projects but not create them', async () => {
    const list = await api('/api/projects?pageSize=100', { cookie: admin });
    const orgs = new Set(list.body.items.map((i: { organizationName: string }) => i.organizationName));
    // Other test files add companies of their own; both demo companies must be among them.
    expect([...orgs]).toEqual(expect.arrayContaining(['Demo Closet Works', 'Demo Second Company']));
    const create = await api('/api/projects', postJson({ name: 'x', siteAddress: 'somewhere', jurisdiction: 'demo-county' }, { cookie: admin }));
    expect(create.status).toBe(403);
  });
});

describe('plan revisions and checks', () => {
  it('saves each plan as a new revision with a change summary, never overwriting', async () => {
    const p = await newProject(installer);
    const r1 = await api(`/api/projects/${p.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }));
    expect(r1.status).toBe(201);
    expect(r1.body.revision).toMatchObject({ number: 1, changeSummary: 'First plan' });
    const changed = { ...hallClosetPassPlan, enclosure: { ...hallClosetPassPlan.enclosure, width: '60 in' } };
    const r2 = await api(`/api/projects/${p.id}/plans`, postJson({ plan: changed }, { cookie: colleague }));
    expect(r2.body.revision.number).toBe(2);
    expect(r2.body.revision.changeSummary).toBe(`Enclosure width 4' 8" → 60 in`);
    const first = await api(`/api/projects/${p.id}/plans/1`, { cookie: installer });
    expect(first.body.plan.enclosure.width).toBe(`4' 8"`);
    const list = await api(`/api/projects/${p.id}/plans`, { cookie: installer });
    expect(list.body.revisions.map((r: { number: number; createdBy: { name: string } }) => [r.number, r.createdBy.name])).toEqual([
      [2, 'Sam Demo (installer)'],
      [1, 'Robin Demo (installer)'],
    ]);
    // The database itself refuses to rewrite a revision.
    await expect(db.updateTable('plan_revisions').set({ change_summary: 'x' }).where('project_id', '=', p.id).execute()).rejects.toThrow(/append-only/);
  });

  it('rejects an invalid plan with the path and keeps the last good revision', async () => {
    const p = await newProject(installer);
    await api(`/api/projects/${p.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }));
    const bad = { ...hallClosetPassPlan, enclosure: { ...hallClosetPassPlan.enclosure, width: '30 furlongs', colour: 'red' } };
    const res = await api(`/api/projects/${p.id}/plans`, postJson({ plan: bad }, { cookie: installer }));
    expect(res.status).toBe(400);
    const paths = res.body.errors.map((e: { path: string }) => e.path);
    expect(paths).toEqual(expect.arrayContaining(['plan.enclosure.width', 'plan.enclosure.colour']));
    const latest = await api(`/api/projects/${p.id}/plans/latest`, { cookie: installer });
    expect(latest.body.number).toBe(1);
  });

  it('stores a check pinned to the plan revision and the published rule set version', async () => {
    const p = await newProject(installer);
    const noPlan = await api(`/api/projects/${p.id}/checks`, postJson({}, { cookie: installer }));
    expect(noPlan.status).toBe(409);
    await api(`/api/projects/${p.id}/plans`, postJson({ plan: longExhaustFailPlan }, { cookie: installer }));
    const res = await api(`/api/projects/${p.id}/checks`, postJson({}, { cookie: installer }));
    expect(res.status).toBe(201);
    const check = res.body;
    expect(check.planRevision.number).toBe(1);
    expect(check.ruleSet).toMatchObject({ version: 1, jurisdiction: 'demo-county' });
    expect(check.outcome).toBe('fail');
    const dl = check.findings.find((f: { ruleKey: string }) => f.ruleKey === 'exhaust.developed-length');
    // 6 + 10 + 8 + 4 ft straight and three mitered 90° (5 ft each) plus one mitered 45° (2 ft 6 in):
    // 28 + 15 + 2.5 = 45 ft 6 in (IRC 2018 Table M1502.4.5.1), over 35 ft (M1502.4.5.1).
    expect(dl).toMatchObject({ status: 'fail', display: { measured: `45' 6"`, limit: `35' 0"` }, citation: { code: 'IRC', edition: '2018', section: 'M1502.4.5.1' } });
    expect(check.facts['exhaust.developedLengthIn']).toBe(546);
    const listed = await api(`/api/projects/${p.id}`, { cookie: installer });
    expect(listed.body.latestCheck).toMatchObject({ id: check.id, outcome: 'fail' });
    await expect(db.deleteFrom('checks').where('id', '=', check.id).execute()).rejects.toThrow(/append-only/);
  });
});
