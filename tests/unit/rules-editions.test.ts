import { describe, expect, it } from 'vitest';
import { editionsSchema, parseEdition } from '@/lib/domain/editions';
import { defaultParameters, ruleSetParametersSchema } from '@/lib/domain/params';
import { buildRuleSet } from '@/rules';
import { EDITIONS_2018, EDITIONS_2021, findingFor, variant } from './support/check';

const withElectrical = (electrical: string) => ({ ...EDITIONS_2018, electrical });
const withBuilding = (building: string) => ({ ...EDITIONS_2018, building });

describe('editions', () => {
  it('parses "IRC 2021"', () => {
    expect(parseEdition('IRC 2021')).toEqual({ code: 'IRC', year: 2021 });
    expect(parseEdition('NEC 2017')).toEqual({ code: 'NEC', year: 2017 });
    expect(parseEdition('2021')).toBeNull();
    expect(editionsSchema.safeParse({ ...EDITIONS_2018, extra: 1 }).success).toBe(false);
  });
  it('default parameters satisfy the parameter schema for every edition pair', () => {
    for (const editions of [EDITIONS_2018, EDITIONS_2021, withBuilding('IRC 2009'), withElectrical('NEC 2023')]) {
      expect(ruleSetParametersSchema.safeParse(defaultParameters(editions)).success).toBe(true);
    }
  });
});

describe('edition differences', () => {
  it('dryer receptacle GFCI: not required by NEC 2017, required by NEC 2020', async () => {
    // NEC 2017 210.8(A)(10) covers 125-V laundry receptacles; NEC 2020 210.8(A) reaches 250 V.
    const plan = variant((p) => (p.electrical.receptacles[1].gfci = false));
    const nec2017 = await findingFor('electrical.dryer-gfci', plan, withElectrical('NEC 2017'));
    const nec2020 = await findingFor('electrical.dryer-gfci', plan, withElectrical('NEC 2020'));
    expect(nec2017.status).toBe('not-applicable');
    expect(nec2020.status).toBe('fail');
    expect(nec2020.citation).toEqual({ code: 'NEC', edition: '2020', section: '210.8(A)(10)' });
    // NEC 2023 210.8(D): dryer outlets.
    const nec2023 = await findingFor('electrical.dryer-gfci', plan, withElectrical('NEC 2023'));
    expect(nec2023.citation.section).toBe('210.8(D)');
  });

  it('washer GFCI and AFCI: none before NEC 2014', async () => {
    // NEC 210.8(A)(10) and 210.12(A) laundry coverage start with NEC 2014.
    const plan = variant((p) => Object.assign(p.electrical.receptacles[0], { gfci: false, afci: false }));
    expect((await findingFor('electrical.washer-gfci', plan, withElectrical('NEC 2011'))).status).toBe('not-applicable');
    expect((await findingFor('electrical.afci', plan, withElectrical('NEC 2011'))).status).toBe('not-applicable');
    expect((await findingFor('electrical.washer-gfci', plan, withElectrical('NEC 2014'))).status).toBe('fail');
    expect((await findingFor('electrical.afci', plan, withElectrical('NEC 2014'))).status).toBe('fail');
  });

  it('length label: every concealed duct under IRC 2015, only over 35 ft under IRC 2018', async () => {
    // IRC 2015 M1502.4.5 (numbered before the 2018 power-ventilator section, TRADE.md M) vs IRC 2018 M1502.4.6 (S).
    const plan = variant((p) => (p.exhaust.lengthLabel = false)); // concealed, 22 ft 3 in developed
    const irc2015 = await findingFor('exhaust.length-label', plan, withBuilding('IRC 2015'));
    const irc2018 = await findingFor('exhaust.length-label', plan, withBuilding('IRC 2018'));
    expect(irc2015.status).toBe('fail');
    expect(irc2015.citation).toEqual({ code: 'IRC', edition: '2015', section: 'M1502.4.5' });
    expect(irc2015.confidence).toBe('M');
    expect(irc2015.citationNote).toBeNull();
    expect(irc2018.status).toBe('not-applicable');
    // IRC 2021 M1502.4.7
    const over = variant((p) => {
      p.exhaust.lengthLabel = false;
      p.dryer.maxDuctLength = '60 ft';
      p.exhaust.run = [{ straight: '40 ft' }];
    });
    const irc2021 = await findingFor('exhaust.length-label', over, EDITIONS_2021);
    expect(irc2021.status).toBe('fail');
    expect(irc2021.citation.section).toBe('M1502.4.7');
  });

  it('standpipe: 36 in passes IPC (18-42 in) but fails UPC (18-30 in)', async () => {
    // IPC 802.4 / IRC P2706.2: 18-42 in; UPC 804.1: 18-30 in.
    const upc = { ...EDITIONS_2018, plumbing: 'UPC 2021', plumbingFamily: 'UPC' as const };
    const plan = variant((p) => (p.plumbing.standpipeHeight = 36));
    expect((await findingFor('plumbing.standpipe-height', plan)).status).toBe('pass');
    const upcFinding = await findingFor('plumbing.standpipe-height', plan, upc);
    expect(upcFinding.status).toBe('fail');
    expect(upcFinding.failedCondition).toBe('standpipe-max');
    expect(upcFinding.limit).toEqual({ min: 18, max: 30 });
    expect(upcFinding.citation).toEqual({ code: 'UPC', edition: '2021', section: '804.1' });
    expect(upcFinding.remedy).toBe(`Lower the standpipe by 6" (to 30" above the trap weir).`);
    const low = await findingFor('plumbing.standpipe-height', variant((p) => (p.plumbing.standpipeHeight = 17)));
    expect(low.failedCondition).toBe('standpipe-min');
    expect(low.remedy).toBe(`Raise the standpipe by 1" (to 18" above the trap weir).`);
  });

  it('developed length cites IRC 2018 M1502.4.5.1 and IRC 2021 M1502.4.6.1', () => {
    // TRADE.md V: same rule, renumbered.
    const section = (editions: typeof EDITIONS_2018) =>
      buildRuleSet(editions).rules.find((r) => r.key === 'exhaust.developed-length')!;
    expect(section(EDITIONS_2018).citation).toEqual({ code: 'IRC', edition: '2018', section: 'M1502.4.5.1' });
    expect(section(EDITIONS_2018).confidence).toBe('V');
    expect(section(EDITIONS_2021).citation).toEqual({ code: 'IRC', edition: '2021', section: 'M1502.4.6.1' });
    const unknown = section(withBuilding('IRC 2024'));
    expect(unknown.confidence).toBe('M');
    expect(unknown.citationNote).toMatch(/confirm it in the adopted IRC 2024/);
  });

  it('IRC 2012/2015 exhaust sections are numbered before the 2018 power-ventilator section', () => {
    // TRADE.md: 2012/2015 length M1502.4.4.1, maker's length M1502.4.4.2, label M1502.4.5 (2012 S, 2015 M).
    const rule = (building: string, key: string) => buildRuleSet(withBuilding(building)).rules.find((r) => r.key === key)!;
    const length2015 = rule('IRC 2015', 'exhaust.developed-length');
    expect(length2015.citation).toEqual({ code: 'IRC', edition: '2015', section: 'M1502.4.4.1' });
    expect(length2015.confidence).toBe('M');
    expect(length2015.citationNote).toBeNull();
    const length2012 = rule('IRC 2012', 'exhaust.developed-length');
    expect(length2012.citation.section).toBe('M1502.4.4.1');
    expect(length2012.confidence).toBe('S');
    const maker2015 = length2015.citationVariants!.variants.find((v) => v.when['exhaust.allowedLengthSource'] === 'manufacturer')!;
    expect(maker2015.citation).toEqual({ code: 'IRC', edition: '2015', section: 'M1502.4.4.2' });
    expect(maker2015.confidence).toBe('M');
    expect(rule('IRC 2015', 'exhaust.length-label').citation.section).toBe('M1502.4.5');
    expect(rule('IRC 2012', 'exhaust.length-label').citation.section).toBe('M1502.4.5');
    // 2018 and 2021 keep their verified numbers: M1502.4.5.1 / M1502.4.6.1 (TRADE.md V), label M1502.4.6 / M1502.4.7 (S).
    expect(rule('IRC 2018', 'exhaust.developed-length').citation.section).toBe('M1502.4.5.1');
    expect(rule('IRC 2018', 'exhaust.length-label').citation.section).toBe('M1502.4.6');
    expect(rule('IRC 2021', 'exhaust.length-label').citation.section).toBe('M1502.4.7');
    // No power-ventilator section before 2018: the booster-fan rule borrows 2018's number, lowered to M, with a note.
    const fan2015 = rule('IRC 2015', 'exhaust.booster-fan');
    expect(fan2015.citation).toEqual({ code: 'IRC', edition: '2015', section: 'M1502.4.4' });
    expect(fan2015.confidence).toBe('M');
    expect(fan2015.citationNote).toMatch(/taken from IRC 2018; confirm it in the adopted IRC 2015/);
  });

  it('an edition the catalog does not know is cited from the nearest known one, lowered to M, with a note', () => {
    const rule = (key: string) => buildRuleSet(withBuilding('IRC 2024')).rules.find((r) => r.key === key)!;
    const length = rule('exhaust.developed-length');
    expect(length.citation).toEqual({ code: 'IRC', edition: '2024', section: 'M1502.4.6.1' }); // nearest: IRC 2021
    expect(length.confidence).toBe('M');
    expect(length.citationNote).toMatch(/taken from IRC 2021; confirm it in the adopted IRC 2024/);
    const maker = length.citationVariants!.variants.find((v) => v.when['exhaust.allowedLengthSource'] === 'manufacturer')!;
    expect(maker.citation.section).toBe('M1502.4.6.2');
    expect(maker.confidence).toBe('M');
    expect(maker.citationNote).toMatch(/confirm it in the adopted IRC 2024/);
  });

  it('support spacing from IRC 2015 (12 ft); terminal opening from IRC 2018 (12.5 sq in)', async () => {
    // IRC M1502.4.2: 12 ft supports, 2015 and later; IRC 2018 M1502.3: 12.5 sq in opening (TRADE.md S).
    const plan = variant((p) => {
      p.exhaust.supportSpacing = '13 ft';
      p.exhaust.termination.openingArea = '10 sq in';
    });
    expect((await findingFor('exhaust.support-spacing', plan, withBuilding('IRC 2012'))).status).toBe('not-applicable');
    const spacing2015 = await findingFor('exhaust.support-spacing', plan, withBuilding('IRC 2015'));
    expect(spacing2015.status).toBe('fail');
    expect(spacing2015.citation).toEqual({ code: 'IRC', edition: '2015', section: 'M1502.4.2' });
    expect(spacing2015.remedy).toBe(`Add supports so none are more than 12' 0" apart (the widest gap is 1' 0" too long).`);
    expect((await findingFor('exhaust.terminal-opening', plan, withBuilding('IRC 2015'))).status).toBe('not-applicable');
    const opening2021 = await findingFor('exhaust.terminal-opening', plan, EDITIONS_2021);
    expect(opening2021.status).toBe('fail');
    expect(opening2021.citation).toEqual({ code: 'IRC', edition: '2021', section: 'M1502.3' });
    expect(opening2021.limit).toBe(12.5);
  });

  it('booster fans: a listed booster passes IRC 2018 but not IRC 2021', async () => {
    // IRC 2021 M1502.4.5 bars domestic booster fans; only listed dryer exhaust duct power ventilators.
    const plan = variant((p) => (p.exhaust.boosterFan = { kind: 'booster', listed: true }));
    expect((await findingFor('exhaust.booster-fan', plan, EDITIONS_2018)).status).toBe('pass');
    const f2021 = await findingFor('exhaust.booster-fan', plan, EDITIONS_2021);
    expect(f2021.status).toBe('fail');
    expect(f2021.failedCondition).toBe('fan-kind-allowed');
    expect(f2021.citation.section).toBe('M1502.4.5');
  });

  it('duct thickness: 0.016 in before IRC 2018, 0.0157 in from 2018', async () => {
    // IRC M1502.4.1 (TRADE.md S).
    const plan = variant((p) => (p.exhaust.thickness = '0.0158 in'));
    expect((await findingFor('exhaust.thickness', plan, withBuilding('IRC 2015'))).status).toBe('fail');
    expect((await findingFor('exhaust.thickness', plan, EDITIONS_2018)).status).toBe('pass');
  });

  it('fasteners: none may penetrate under IRC 2009; 1/8 in from 2015', async () => {
    // IRC M1502.4.2: 1/8 in from 2015 (S); 2009 none (TRADE.md).
    const plan = variant((p) => Object.assign(p.exhaust, { fastenersIntoAirstream: true, fastenerProtrusion: '1/16' }));
    expect((await findingFor('exhaust.fasteners', plan, withBuilding('IRC 2009'))).status).toBe('fail');
    expect((await findingFor('exhaust.fasteners', plan, withBuilding('IRC 2015'))).status).toBe('pass');
  });

  it('local amendments: drain pan over finished space, termination clearance deleted', async () => {
    // Local amendment (Baltimore City IPC 406.3, TRADE.md V): pan where leakage can damage the structure.
    const overrides = { parameters: { plumbing: { drainPanPolicy: 'over-finished-space' as const, drainPanSection: '406.3' } } };
    const noPan = variant((p) => (p.plumbing.drainPan = null));
    const f = await findingFor('plumbing.drain-pan', noPan, EDITIONS_2018, overrides);
    expect(f.status).toBe('fail');
    expect(f.citation).toEqual({ code: 'local amendment', edition: 'IPC 2018', section: '406.3' });
    const notOverFinished = variant((p) => {
      p.plumbing.drainPan = null;
      p.space.overFinishedSpace = false;
    });
    expect((await findingFor('plumbing.drain-pan', notOverFinished, EDITIONS_2018, overrides)).status).toBe('not-applicable');
    // Model codes: no pan requirement.
    expect((await findingFor('plumbing.drain-pan', noPan)).status).toBe('not-applicable');
    // IRC M1502.3: some states delete the 3 ft clause.
    const close = variant((p) => (p.exhaust.termination.clearanceToOpenings = '1 ft'));
    const deleted = await findingFor('exhaust.termination-clearance', close, EDITIONS_2018, { parameters: { exhaust: { terminationClearanceIn: null } } });
    expect(deleted.status).toBe('not-applicable');
  });

  it('a local amendment that changes the maximum length changes the limit', async () => {
    const plan = variant((p) => (p.exhaust.run = [{ straight: '30 ft' }]));
    const f = await findingFor('exhaust.developed-length', plan, EDITIONS_2018, { parameters: { exhaust: { maxDevelopedLengthIn: 25 * 12 } } });
    expect(f.status).toBe('fail');
    expect(f.display.limit).toBe(`25' 0"`);
  });

  it('rejects unknown rule keys and bad parameter overrides', () => {
    expect(() => buildRuleSet(EDITIONS_2018, { rules: { 'exhaust.nope': { enabled: false } } })).toThrow(/Unknown rule keys/);
    expect(() => buildRuleSet(EDITIONS_2018, { parameters: { exhaust: { maxDevelopedLengthIn: -1 } } })).toThrow();
    expect(() => buildRuleSet({ ...EDITIONS_2018, building: 'the good one' })).toThrow();
  });
});
