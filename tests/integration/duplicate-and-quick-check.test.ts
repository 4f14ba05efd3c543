import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, postJson, signIn } from './helpers';

const db = appDb();
let installer: string; // Demo Closet Works
let other: string; // Demo Second Company
let inspector: string;
let admin: string;

const tag = () => randomBytes(3).toString('hex');

beforeAll(async () => {
  [installer, other, inspector, admin] = await Promise.all([
    signIn('installer@nookpass.demo'),
    signIn('other-installer@nookpass.demo'),
    signIn('inspector@nookpass.demo'),
    signIn('admin@nookpass.demo'),
  ]);
});
afterAll(async () => {
  await db.destroy();
});

async function projectWithPlans(...plans: unknown[]) {
  const project = (await api('/api/projects', postJson({ name: `IT source ${tag()}`, siteAddress: '9 Source St', jurisdiction: 'demo-county' }, { cookie: installer }))).body;
  for (const plan of plans) expect((await api(`/api/projects/${project.id}/plans`, postJson({ plan }, { cookie: installer }))).status).toBe(201);
  return project;
}

describe('duplicating a project', () => {
  it('starts a new project from the latest plan, leaving the source as it was', async () => {
    const source = await projectWithPlans(longExhaustFailPlan, hallClosetPassPlan);
    const res = await api(`/api/projects/${source.id}/duplicate`, postJson({ siteAddress: '10 New Job Rd' }, { cookie: installer }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: `Copy of ${source.name}`, siteAddress: '10 New Job Rd', jurisdiction: { slug: 'demo-county' }, latestRevision: 1 });
    expect(res.body.id).not.toBe(source.id);

    const copied = await api(`/api/projects/${res.body.id}/plans/1`, { cookie: installer });
    expect(copied.body.plan).toEqual(hallClosetPassPlan);
    expect(copied.body.changeSummary).toBe(`Copied from “${source.name}”, revision 2`);
    const sourceRevisions = await api(`/api/projects/${source.id}/plans`, { cookie: installer });
    expect(sourceRevisions.body.revisions.map((r: { number: number }) => r.number)).toEqual([2, 1]);
    const audit = await db.selectFrom('audit_log').select(['action', 'details']).where('entity_id', '=', res.body.id).execute();
    expect(audit).toEqual([{ action: 'project.duplicate', details: expect.objectContaining({ from: source.id, revision: 2 }) }]);
  });

  it('copies the revision named, into another jurisdiction when asked', async () => {
    const source = await projectWithPlans(longExhaustFailPlan, hallClosetPassPlan);
    const res = await api(`/api/projects/${source.id}/duplicate`, postJson({ revision: 1, name: 'IT from revision 1', jurisdiction: 'demo-city' }, { cookie: installer }));
    expect(res.status).toBe(201);
    expect(res.body.jurisdiction.slug).toBe('demo-city');
    expect((await api(`/api/projects/${res.body.id}/plans/1`, { cookie: installer })).body.plan).toEqual(longExhaustFailPlan);
  });

  it('names the field on bad input and hides other companies’ projects', async () => {
    const source = await projectWithPlans(hallClosetPassPlan);
    const bad = await api(`/api/projects/${source.id}/duplicate`, postJson({ revision: 0, name: '', jurisdiction: 'nowhere' }, { cookie: installer }));
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['name', 'revision']);
    const missing = await api(`/api/projects/${source.id}/duplicate`, postJson({ revision: 7 }, { cookie: installer }));
    expect(missing.status).toBe(400);
    expect(missing.body.errors[0].path).toBe('revision');
    const nowhere = await api(`/api/projects/${source.id}/duplicate`, postJson({ jurisdiction: 'nowhere' }, { cookie: installer }));
    expect(nowhere.status).toBe(400);
    expect(nowhere.body.errors[0].path).toBe('jurisdiction');
    const empty = (await api('/api/projects', postJson({ name: `IT empty ${tag()}`, siteAddress: '1 Empty St', jurisdiction: 'demo-county' }, { cookie: installer }))).body;
    expect((await api(`/api/projects/${empty.id}/duplicate`, postJson({}, { cookie: installer }))).status).toBe(400);

    expect((await api(`/api/projects/${source.id}/duplicate`, postJson({}, { cookie: other }))).status).toBe(404);
    expect((await api(`/api/projects/${source.id}/duplicate`, postJson({}, { cookie: inspector }))).status).toBe(403);
    // Admins read every project but create none.
    expect((await api(`/api/projects/${source.id}/duplicate`, postJson({}, { cookie: admin }))).status).toBe(403);
    expect((await api(`/api/projects/${source.id}/duplicate`, postJson({}))).status).toBe(401);
  });
});

describe('quick check', () => {
  it('evaluates a plan without a project and stores nothing', async () => {
    const projectsBefore = await db.selectFrom('projects').select(db.fn.countAll<string>().as('n')).executeTakeFirstOrThrow();
    const res = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: longExhaustFailPlan }, { cookie: installer }));
    expect(res.status).toBe(200);
    // IRC 2018 M1502.4.5.1: 35 ft developed length; the demo long route is past it.
    expect(res.body.findings.find((f: { ruleKey: string }) => f.ruleKey === 'exhaust.developed-length').status).toBe('fail');
    const projectsAfter = await db.selectFrom('projects').select(db.fn.countAll<string>().as('n')).executeTakeFirstOrThrow();
    expect(projectsAfter.n).toBe(projectsBefore.n);
  });

  it('saves the checked plan as a new project on request', async () => {
    const name = `IT quick ${tag()}`;
    const res = await api('/api/quick-checks', postJson({ name, siteAddress: '3 Quick Way', jurisdiction: 'demo-city', plan: hallClosetPassPlan }, { cookie: installer }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name, jurisdiction: { slug: 'demo-city' }, latestRevision: 1 });
    const revision = await api(`/api/projects/${res.body.id}/plans/1`, { cookie: installer });
    expect(revision.body.plan).toEqual(hallClosetPassPlan);
    expect(revision.body.changeSummary).toBe('First plan (from a quick check)');
  });

  it('refuses a bad plan or bad details with the fields named, and saves nothing', async () => {
    const name = `IT quick bad ${tag()}`;
    const bad = await api('/api/quick-checks', postJson({ name, siteAddress: '3 Quick Way', jurisdiction: 'demo-county', plan: { units: 'imperial', washer: { width: 'wide' } } }, { cookie: installer }));
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path)).toEqual(['plan.washer.width']);
    const details = await api('/api/quick-checks', postJson({ name: '', siteAddress: '', jurisdiction: 'nowhere', plan: hallClosetPassPlan }, { cookie: installer }));
    expect(details.status).toBe(400);
    expect(details.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['name', 'siteAddress']);
    const nowhere = await api('/api/quick-checks', postJson({ name, siteAddress: '3 Quick Way', jurisdiction: 'nowhere', plan: hallClosetPassPlan }, { cookie: installer }));
    expect(nowhere.status).toBe(400);
    expect(nowhere.body.errors[0].path).toBe('jurisdiction');
    expect(await db.selectFrom('projects').select('id').where('name', '=', name).execute()).toEqual([]);
    expect((await api('/api/quick-checks', postJson({ name, siteAddress: '3 Quick Way', jurisdiction: 'demo-county', plan: hallClosetPassPlan }, { cookie: inspector }))).status).toBe(403);
  });
});
