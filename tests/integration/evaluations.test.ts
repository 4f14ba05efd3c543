import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { gasWalkInBedroomPlan, hallClosetPassPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, postJson, signIn } from './helpers';

const db = appDb();
let token: string;
let cookie: string;

beforeAll(async () => {
  cookie = await signIn('installer@nookpass.demo');
  const created = await api('/api/tokens', postJson({ name: 'evaluations test' }, { cookie }));
  token = created.body.token;
});
afterAll(async () => {
  await db.destroy();
});

const areas = ['exhaust', 'makeup-air', 'gas', 'electrical', 'plumbing', 'clearances', 'service', 'door-hardware'];

describe('POST /api/evaluations', () => {
  for (const slug of ['demo-county', 'demo-city']) {
    it(`returns cited findings for every area in ${slug}, stores nothing`, async () => {
      const before = await db.selectFrom('checks').select(db.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
      const res = await api('/api/evaluations', postJson({ jurisdiction: slug, plan: hallClosetPassPlan }, { token }));
      expect(res.status).toBe(200);
      expect(res.body.ruleSet).toEqual({ jurisdiction: slug, version: expect.any(Number) });
      const seen = new Set(res.body.findings.map((f: { area: string }) => f.area));
      for (const a of areas) expect(seen.has(a), a).toBe(true);
      for (const f of res.body.findings) {
        expect(f.citation.code, f.ruleKey).toBeTruthy();
        expect(['pass', 'fail', 'caution', 'needs-info', 'not-applicable']).toContain(f.status);
      }
      const s = res.body.summary;
      expect(s.pass + s.fail + s.caution + s.needsInfo + s.notApplicable).toBe(res.body.findings.length);
      const after = await db.selectFrom('checks').select(db.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
      expect(Number(after.n)).toBe(Number(before.n));
    });
  }

  it('cites the adopted edition: IRC 2018 M1502.4.5.1 in the county, IRC 2021 M1502.4.6.1 in the city', async () => {
    const county = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: longExhaustFailPlan }, { token }));
    const city = await api('/api/evaluations', postJson({ jurisdiction: 'demo-city', plan: longExhaustFailPlan }, { token }));
    const dl = (body: any) => body.findings.find((f: { ruleKey: string }) => f.ruleKey === 'exhaust.developed-length');
    expect(dl(county.body).citation).toEqual({ code: 'IRC', edition: '2018', section: 'M1502.4.5.1' }); // renumbered in 2021
    expect(dl(city.body).citation).toEqual({ code: 'IRC', edition: '2021', section: 'M1502.4.6.1' });
    expect(dl(county.body).status).toBe('fail');
    expect(dl(county.body).remedy).toMatch(/shorten/i);
  });

  it('answers with the failing findings only when asked, the summary still counting every finding', async () => {
    const full = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: longExhaustFailPlan }, { token }));
    const failing = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: longExhaustFailPlan, findings: 'failing' }, { token }));
    expect(failing.status).toBe(200);
    const fails = full.body.findings.filter((f: { status: string }) => f.status === 'fail');
    expect(fails.length).toBeGreaterThan(0);
    expect(full.body.findings.length).toBeGreaterThan(fails.length);
    expect(failing.body.findings).toEqual(fails);
    expect(failing.body.summary).toEqual(full.body.summary);
    // IRC 2018 M1502.4.5.1: 28 ft of straight duct plus three mitered 90° elbows (5 ft each, Table M1502.4.5.1)
    // and a mitered 45° (2 ft 6 in) is 45 ft 6 in developed, over the 35 ft maximum.
    expect(failing.body.findings.map((f: { ruleKey: string }) => f.ruleKey)).toContain('exhaust.developed-length');
    const bad = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: longExhaustFailPlan, findings: 'some' }, { token }));
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0]).toMatchObject({ path: 'findings' });
    expect(bad.body.errors[0].message).toMatch(/"failing"/);
  });

  it('applies the city’s washer-pan amendment and the UPC standpipe range', async () => {
    const noPan = { ...hallClosetPassPlan, plumbing: { ...hallClosetPassPlan.plumbing, drainPan: { present: false }, standpipeHeight: 36 } };
    const city = await api('/api/evaluations', postJson({ jurisdiction: 'demo-city', plan: noPan }, { token }));
    const county = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: noPan }, { token }));
    const byKey = (body: any) => Object.fromEntries(body.findings.map((f: { ruleKey: string }) => [f.ruleKey, f]));
    const c = byKey(city.body);
    const k = byKey(county.body);
    const panKey = Object.keys(c).find((key) => key.startsWith('plumbing.') && key.includes('pan'))!;
    expect(c[panKey].status).toBe('fail'); // over finished space, local amendment
    expect(['pass', 'not-applicable']).toContain(k[panKey].status); // no model-code requirement
    const standpipeKey = Object.keys(c).find((key) => key.includes('standpipe'))!;
    // 36 in: inside IPC's 18–42 in (IRC P2706.2) but above UPC 804.1's 30 in.
    expect(k[standpipeKey].status).toBe('pass');
    expect(c[standpipeKey].status).toBe('fail');
  });

  it('flags a gas dryer in a walk-in closet off a bedroom', async () => {
    const res = await api('/api/evaluations', postJson({ jurisdiction: 'demo-city', plan: gasWalkInBedroomPlan }, { token }));
    const gas = res.body.findings.filter((f: { area: string }) => f.area === 'gas');
    expect(gas.some((f: { status: string }) => f.status === 'fail' || f.status === 'caution')).toBe(true);
  });

  it('answers 400 with paths for a bad plan, 404 for an unknown jurisdiction, 401 without credentials', async () => {
    const bad = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: { units: 'imperial', enclosure: { width: 'wide' }, extra: 1 } }, { token }));
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path)).toEqual(expect.arrayContaining(['plan.enclosure.width', 'plan.extra']));
    const missingJ = await api('/api/evaluations', postJson({ plan: hallClosetPassPlan }, { token }));
    expect(missingJ.status).toBe(400);
    expect(missingJ.body.errors[0].path).toBe('jurisdiction');
    const unknown = await api('/api/evaluations', postJson({ jurisdiction: 'atlantis', plan: hallClosetPassPlan }, { token }));
    expect(unknown.status).toBe(404);
    const anon = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: hallClosetPassPlan }));
    expect(anon.status).toBe(401);
  });

  it('lets an empty plan through as needs-info findings, not a crash', async () => {
    const res = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: { units: 'metric' } }, { token }));
    expect(res.status).toBe(200);
    expect(res.body.summary.needsInfo).toBeGreaterThan(10);
  });

  it('reports the published version in /api/jurisdictions', async () => {
    const res = await api('/api/jurisdictions', { token });
    // Jurisdictions other tests create may have no published version yet; the demo ones always have one.
    const demo = res.body.filter((j: { slug: string }) => j.slug === 'demo-county' || j.slug === 'demo-city');
    expect(demo).toHaveLength(2);
    for (const j of demo) expect(j.publishedVersion).toBeGreaterThanOrEqual(1);
  });
});

describe('GET /api/schema/plan', () => {
  it('serves the JSON Schema of the plan', async () => {
    const res = await api('/api/schema/plan');
    expect(res.status).toBe(200);
    expect(res.body.type).toBe('object');
    expect(res.body.additionalProperties).toBe(false);
    expect(Object.keys(res.body.properties)).toEqual(expect.arrayContaining(['units', 'enclosure', 'exhaust', 'doors']));
  });
});
