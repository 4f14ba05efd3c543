import { describe, expect, it } from 'vitest';
import { parsePlan } from '@/lib/domain/plan';
import { baselineRules } from '@/rules';
import { check, EDITIONS_2018, EDITIONS_2021, finding, findingFor, variant, type LoosePlan } from './support/check';

const withElectrical = (electrical: string) => ({ ...EDITIONS_2018, electrical });
const withBuilding = (building: string) => ({ ...EDITIONS_2018, building });

const heatPump = (p: LoosePlan) => Object.assign(p.dryer, { type: 'heat-pump', condensate: 'drain', condensateDrainTo: 'standpipe', condensateDrainReachable: true });
const exhaustKeys = baselineRules.filter((r) => r.area === 'exhaust').map((r) => r.key);

describe('ventless dryers', () => {
  // IRC M1502.2 exception and M1502.4.7 (2018) / M1502.4.8 (2021): a listed condensing dryer needs no exhaust duct (TRADE.md S).
  it.each(['condensing', 'heat-pump'])('a %s dryer with no exhaust in the plan: every exhaust rule is not-applicable, none needs-info', async (type) => {
    const plan = variant((p) => {
      heatPump(p);
      p.dryer.type = type;
      delete p.exhaust;
      delete p.dryer.exhaustCfm;
    });
    const evaluation = await check(plan);
    for (const key of exhaustKeys) {
      const f = finding(evaluation, key);
      expect(f.status, key).toBe('not-applicable');
      expect(f.message).toMatch(/needs no exhaust duct/);
      expect(f.citation).toEqual({ code: 'IRC', edition: '2018', section: 'M1502.2 exception' });
      expect(f.confidence).toBe('S');
    }
    // No exhaust to make up either.
    expect(finding(evaluation, 'makeup-air.exhaust-rate').status).toBe('not-applicable');
    expect(evaluation.findings.filter((f) => f.status === 'needs-info')).toEqual([]);
  });

  it('a ventless dryer whose plan still carries a failing route is not failed for it', async () => {
    const plan = variant((p) => {
      heatPump(p);
      p.exhaust.material = 'flexible-vinyl';
      p.exhaust.termination.location = 'attic';
    });
    expect((await findingFor('exhaust.material', plan)).status).toBe('not-applicable');
    expect((await findingFor('exhaust.termination-location', plan)).status).toBe('not-applicable');
  });

  it('a dryer without a type is vented: the exhaust rules apply and ask for what is missing', async () => {
    const plan = variant((p) => delete p.exhaust.termination.location);
    const f = await findingFor('exhaust.termination-location', plan);
    expect(f.status).toBe('needs-info');
    expect(f.missing).toEqual(['exhaust.termination.location']);
    expect((await findingFor('plumbing.condensate-drain', plan)).status).toBe('not-applicable');
  });

  it("the maker's closet clearances still apply to a ventless dryer", async () => {
    // IRC M1307.1: installed per the listing and the maker's instructions (TRADE.md S). Enclosure fits the
    // pair with the plan's clearances at 52.5 in wide and fails at 52.4 in (see the baseline cases).
    const plan = variant((p) => {
      heatPump(p);
      p.enclosure.width = 52.4;
    });
    expect((await findingFor('clearances.width', plan)).status).not.toBe('pass');
    expect((await findingFor('clearances.width', plan)).status).not.toBe('not-applicable');
  });

  it('condensate: needs-info when a ventless plan does not say; a reservoir needs no drain; a hose led nowhere fails', async () => {
    const unsaid = await findingFor('plumbing.condensate-drain', variant((p) => (p.dryer.type = 'condensing')));
    expect(unsaid.status).toBe('needs-info');
    expect(unsaid.missing).toEqual(['dryer.condensate']);
    const reservoir = await findingFor('plumbing.condensate-drain', variant((p) => Object.assign(p.dryer, { type: 'condensing', condensate: 'reservoir' })));
    expect(reservoir.status).toBe('not-applicable');
    const nowhere = await findingFor(
      'plumbing.condensate-drain',
      variant((p) => Object.assign(p.dryer, { type: 'condensing', condensate: 'drain', condensateDrainTo: 'none' })),
    );
    expect(nowhere.status).toBe('fail');
    expect(nowhere.failedCondition).toBe('drains-to-receptor');
    // The maker's instructions bind through IRC M1307.1 in a dwelling (TRADE.md S).
    expect(nowhere.citation).toEqual({ code: 'IRC', edition: '2018', section: 'M1307.1' });
  });
});

describe('hard-wired dryers', () => {
  const hardWired = (gfci: boolean) => (p: LoosePlan) =>
    Object.assign(p.electrical.receptacles[1], { hardWired: true, gfci, disconnect: 'within-sight', reachableInstalled: false });

  it('NEC 2023 210.8(D): GFCI for a hard-wired dryer outlet; NEC 2020 and 2017 210.8(A) cover receptacles only', async () => {
    // NEC 2023 210.8(D) covers dryer outlets, hard-wired or cord-and-plug (TRADE.md V).
    const unprotected = variant(hardWired(false));
    const nec2023 = await findingFor('electrical.dryer-gfci', unprotected, withElectrical('NEC 2023'));
    expect(nec2023.status).toBe('fail');
    expect(nec2023.citation).toEqual({ code: 'NEC', edition: '2023', section: '210.8(D)' });
    expect((await findingFor('electrical.dryer-gfci', variant(hardWired(true)), withElectrical('NEC 2023'))).status).toBe('pass');
    // NEC 2020 210.8(A): 125-250 V receptacles; a hard-wired dryer has none (TRADE.md V).
    const nec2020 = await findingFor('electrical.dryer-gfci', unprotected, withElectrical('NEC 2020'));
    expect(nec2020.status).toBe('not-applicable');
    expect(nec2020.message).toMatch(/hard-wired dryer has none/);
    // The same dryer on a 240 V receptacle is covered by NEC 2020 210.8(A).
    const plugged = variant((p) => (p.electrical.receptacles[1].gfci = false));
    expect((await findingFor('electrical.dryer-gfci', plugged, withElectrical('NEC 2020'))).status).toBe('fail');
    expect((await findingFor('electrical.dryer-gfci', unprotected, withElectrical('NEC 2017'))).status).toBe('not-applicable');
  });

  it('plug reachability (NEC 422.33) and receptacle distance (210.50(C)) do not apply to the hard-wired dryer; its disconnect (422.31) does', async () => {
    const evaluation = await check(variant(hardWired(true)), withElectrical('NEC 2023'));
    // The washer's plug is still reachable, so 422.33 passes on the washer alone.
    expect(finding(evaluation, 'electrical.receptacle-reachable').status).toBe('pass');
    expect(finding(evaluation, 'electrical.dryer-receptacle-reach').status).toBe('not-applicable');
    const disconnect = finding(evaluation, 'electrical.dryer-disconnect');
    expect(disconnect.status).toBe('pass');
    expect(disconnect.citation).toEqual({ code: 'NEC', edition: '2023', section: '422.31' });
    expect(disconnect.confidence).toBe('M');
    // A plugged dryer whose plug is behind it still fails 422.33.
    const hidden = variant((p) => (p.electrical.receptacles[1].reachableInstalled = false));
    expect((await findingFor('electrical.receptacle-reachable', hidden)).status).toBe('fail');
    expect((await findingFor('electrical.dryer-disconnect', hidden)).status).toBe('not-applicable');
  });

  it('with every appliance hard-wired, plug reachability is not-applicable', async () => {
    const plan = variant((p) => {
      for (const r of p.electrical.receptacles) Object.assign(r, { hardWired: true, reachableInstalled: false });
    });
    expect((await findingFor('electrical.receptacle-reachable', plan)).status).toBe('not-applicable');
  });
});

describe("developed length against the maker's maximum", () => {
  const makers = variant((p) => {
    p.dryer.maxDuctLength = '50 ft';
    p.exhaust.run = [{ straight: '40 ft' }];
  });

  it("cites the maker's-length clause per edition and says the instructions must reach the inspector", async () => {
    // IRC 2018 M1502.4.5.2 / 2021 M1502.4.6.2 (TRADE.md S); 2015 M1502.4.4.2 (TRADE.md M).
    const f2018 = await findingFor('exhaust.developed-length', makers, EDITIONS_2018);
    expect(f2018.status).toBe('pass');
    expect(f2018.citation).toEqual({ code: 'IRC', edition: '2018', section: 'M1502.4.5.2' });
    expect(f2018.confidence).toBe('S');
    expect(f2018.message).toMatch(/instructions must reach the inspector before the duct is concealed/);
    const f2021 = await findingFor('exhaust.developed-length', makers, EDITIONS_2021);
    expect(f2021.citation.section).toBe('M1502.4.6.2');
    const f2015 = await findingFor('exhaust.developed-length', makers, withBuilding('IRC 2015'));
    expect(f2015.citation.section).toBe('M1502.4.4.2');
    expect(f2015.confidence).toBe('M');
    // 40 ft against a 35 ft maker's maximum fails, still citing the maker's clause.
    const over = variant((p) => {
      p.dryer.maxDuctLength = '35 ft';
      p.exhaust.run = [{ straight: '40 ft' }];
    });
    const fail = await findingFor('exhaust.developed-length', over);
    expect(fail.status).toBe('fail');
    expect(fail.citation.section).toBe('M1502.4.5.2');
  });

  it('without a maker figure the code length is cited', async () => {
    // IRC 2018 M1502.4.5.1 (TRADE.md V).
    const f = await findingFor('exhaust.developed-length', variant());
    expect(f.citation.section).toBe('M1502.4.5.1');
    expect(f.message).not.toMatch(/inspector/);
  });
});

describe('bad input on the new fields', () => {
  it.each([
    ['dryer.type', (p: LoosePlan) => (p.dryer.type = 'ventless')],
    ['dryer.condensate', (p: LoosePlan) => (p.dryer.condensate = true)],
    ['dryer.condensateDrainTo', (p: LoosePlan) => (p.dryer.condensateDrainTo = 'sink')],
    ['exhaust.termination.location', (p: LoosePlan) => (p.exhaust.termination.location = 'roof')],
    ['exhaust.termination.openingArea', (p: LoosePlan) => (p.exhaust.termination.openingArea = 'big')],
    ['exhaust.supportSpacing', (p: LoosePlan) => (p.exhaust.supportSpacing = 'every stud')],
    ['exhaust.framingFaceClearance', (p: LoosePlan) => (p.exhaust.framingFaceClearance = true)],
    ['exhaust.shieldPlates', (p: LoosePlan) => (p.exhaust.shieldPlates = 'yes')],
    ['electrical.receptacles.1.hardWired', (p: LoosePlan) => (p.electrical.receptacles[1].hardWired = 'yes')],
    ['electrical.receptacles.1.disconnect', (p: LoosePlan) => (p.electrical.receptacles[1].disconnect = 'plug')],
  ])('%s: a wrong value is refused naming the path', (path, mutate) => {
    const parsed = parsePlan(variant(mutate));
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.errors.map((e) => e.path)).toContain(path);
  });
});
