import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, postJson, signIn } from './helpers';

let token: string;

beforeAll(async () => {
  const cookie = await signIn('installer@nookpass.demo');
  const created = await api('/api/tokens', postJson({ name: 'severity test' }, { cookie }));
  token = created.body.token;
});
afterAll(() => {});

type Finding = { ruleKey: string; status: string; citation: { code: string; edition: string | null; section: string | null }; message: string; missing: string[] };

async function evaluate(plan: unknown, jurisdiction = 'demo-county') {
  const res = await api('/api/evaluations', postJson({ jurisdiction, plan }, { token }));
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return (key: string) => (res.body.findings as Finding[]).find((f) => f.ruleKey === key)!;
}

const plan = (change: (p: any) => void) => {
  const p: any = structuredClone(hallClosetPassPlan);
  change(p);
  return p;
};
const gasCloset = (p: any) => {
  p.dryer.fuel = 'gas';
  p.gas = { shutoffDistance: '4 ft', shutoffSameRoom: true, connectorLength: '4 ft', combustionAirFromOutdoors: true };
  Object.assign(p.space, { kind: 'reach-in-closet', opensInto: 'bedroom', dedicatedToLaundry: true, door: { solid: true, weatherStripped: true, selfClosing: true } });
};

describe('POST /api/evaluations: severity, the gas-location exception and the building type', () => {
  it('fails two 24 in units in 44-1/2 in inside with no clearances given, and asks for the clearances apart', async () => {
    // 24 + 24 = 48 in of units (compact size, TRADE.md S) in 44-1/2 in.
    const f = await evaluate({
      units: 'imperial',
      arrangement: 'side-by-side',
      enclosure: { width: 44.5, depth: 30, height: 80, depthMeasured: 'inside' },
      washer: { width: 24, depth: 24, height: 34 },
      dryer: { width: 24, depth: 24, height: 34 },
    });
    expect(f('fit.width').status).toBe('fail');
    expect(f('clearances.width').status).toBe('needs-info');
    expect(f('clearances.width').missing).toEqual(expect.arrayContaining(['washer.clearances.side']));
  });

  it("fails a short maker's clearance citing IRC M1307.1 in the county (IRC 2018)", async () => {
    // 51 in needed (24 + 24 + three 1 in gaps); 52-1/4 in outside less two 3/4 in panels = 50-3/4 in.
    const f = await evaluate(plan((p) => (p.enclosure.width = 52.25)));
    expect(f('clearances.width').status).toBe('fail');
    expect(f('clearances.width').citation).toEqual({ code: 'IRC', edition: '2018', section: 'M1307.1' });
    expect(f('clearances.width').message).toMatch(/1\/4" short/);
  });

  it('passes a gas dryer in a dedicated closet off a bedroom that meets the exception, citing IRC G2406.2; fails a walk-in closet', async () => {
    const dedicated = await evaluate(plan(gasCloset));
    expect(dedicated('gas.location').status).toBe('pass');
    expect(dedicated('gas.location').citation).toEqual({ code: 'IRC', edition: '2018', section: 'G2406.2' });
    const walkIn = await evaluate(plan((p) => { gasCloset(p); p.space.kind = 'walk-in-closet'; }));
    expect(walkIn('gas.location').status).toBe('fail');
  });

  it('cites the adopted IFGC for a building other than a dwelling', async () => {
    const f = await evaluate(plan((p) => { gasCloset(p); p.space.buildingType = 'other'; }));
    expect(f('gas.shutoff').citation).toEqual({ code: 'IFGC', edition: '2018', section: '409.5.1' });
  });

  it('answers 400 naming each bad new field', async () => {
    const res = await api(
      '/api/evaluations',
      postJson({ jurisdiction: 'demo-county', plan: plan((p) => { p.space.buildingType = 'house'; p.space.door = { solid: 'yes' }; p.gas = { combustionAirFromOutdoors: 1 }; }) }, { token }),
    );
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['plan.gas.combustionAirFromOutdoors', 'plan.space.buildingType', 'plan.space.door.solid']);
  });
});
