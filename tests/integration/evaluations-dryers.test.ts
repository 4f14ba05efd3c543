import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, postJson, signIn } from './helpers';

const db = appDb();
let token: string;

beforeAll(async () => {
  const cookie = await signIn('installer@nookpass.demo');
  const created = await api('/api/tokens', postJson({ name: 'dryer kinds test' }, { cookie }));
  token = created.body.token;
});
afterAll(async () => {
  await db.destroy();
});

type Finding = { ruleKey: string; area: string; status: string; citation: { code: string; edition: string | null; section: string | null }; message: string };
const byKey = (body: { findings: Finding[] }) => Object.fromEntries(body.findings.map((f) => [f.ruleKey, f]));

describe('POST /api/evaluations with ventless and hard-wired dryers', () => {
  it('a heat-pump dryer with no exhaust in the plan: exhaust findings not-applicable, never needs-info; its drain is checked', async () => {
    const { exhaust: _exhaust, ...withoutExhaust } = structuredClone(hallClosetPassPlan);
    const plan = {
      ...withoutExhaust,
      dryer: { ...hallClosetPassPlan.dryer, type: 'heat-pump', condensate: 'drain', condensateDrainTo: 'standpipe', condensateDrainReachable: false },
    };
    const res = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan }, { token }));
    expect(res.status).toBe(200);
    const exhaust = (res.body.findings as Finding[]).filter((f) => f.area === 'exhaust');
    expect(exhaust.length).toBeGreaterThan(10);
    for (const f of exhaust) {
      expect(f.status, f.ruleKey).toBe('not-applicable');
      // IRC M1502.2 exception for listed condensing dryers (TRADE.md S).
      expect(f.citation.section, f.ruleKey).toBe('M1502.2 exception');
    }
    const drain = byKey(res.body)['plumbing.condensate-drain'];
    expect(drain.status).toBe('fail');
    expect(res.body.summary.needsInfo).toBe(0);
  });

  it('an exhaust ending in the attic fails; a hard-wired dryer without a disconnect fails (NEC 422.31, from memory)', async () => {
    const plan = structuredClone(hallClosetPassPlan) as any;
    plan.exhaust.termination.location = 'attic';
    Object.assign(plan.electrical.receptacles[1], { hardWired: true, disconnect: 'none' });
    const res = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan }, { token }));
    expect(res.status).toBe(200);
    const f = byKey(res.body);
    // IRC M1502.3 / M1501.1: the duct ends outdoors (TRADE.md S).
    expect(f['exhaust.termination-location'].status).toBe('fail');
    expect(f['exhaust.termination-location'].citation.section).toBe('M1502.3');
    expect(f['electrical.dryer-disconnect'].status).toBe('fail');
    expect(f['electrical.dryer-disconnect'].citation.section).toBe('422.31');
    expect(f['electrical.dryer-receptacle-reach'].status).toBe('not-applicable');
  });

  it('answers 400 naming the path of a wrong type or unknown value in the new fields', async () => {
    const plan = structuredClone(hallClosetPassPlan) as any;
    plan.dryer.type = 'ventless';
    plan.exhaust.termination.location = 'roof';
    plan.exhaust.supportSpacing = true;
    plan.electrical.receptacles[1].hardWired = 'yes';
    const bad = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan }, { token }));
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path)).toEqual(
      expect.arrayContaining(['plan.dryer.type', 'plan.exhaust.termination.location', 'plan.exhaust.supportSpacing', 'plan.electrical.receptacles.1.hardWired']),
    );
  });
});
