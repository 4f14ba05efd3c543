import { describe, expect, it } from 'vitest';
import { baselineRules } from '@/rules';

/*
 * The severity model (DEVELOPERS.md "Severity"): a rule fails when a code section is not met, when the
 * maker's listing and instructions are not met (the code makes them binding: IRC M1307.1, G2408.1), or when
 * the thing cannot physically be built; it cautions where it rests on common practice or advice only.
 * Every baseline rule has a row here: a new rule without one fails this test.
 */
type Basis =
  | 'code' // a code section (or a local amendment) is not met
  | 'listing' // the appliance maker's listing and instructions, bound by the code
  | 'physical' // it cannot be built or serviced as drawn
  | 'common-practice' // trade practice, no published source
  | 'hardware-maker' // cabinet hardware makers' charts: advice, no code section
  | 'under-review'; // kept as it was; the reason says why

const modelSeverity: Record<Basis, 'fail' | 'caution' | null> = {
  code: 'fail',
  listing: 'fail',
  physical: 'fail',
  'common-practice': 'caution',
  'hardware-maker': 'caution',
  'under-review': null,
};

const table: Array<[key: string, severity: 'fail' | 'caution', basis: Basis, why: string]> = [
  ['exhaust.developed-length', 'fail', 'code', 'IRC M1502.4.5.1 (2018) / M1502.4.6.1 (2021): 35 ft or the maker’s maximum'],
  ['exhaust.material', 'fail', 'code', 'IRC M1502.4.1: rigid metal, smooth interior'],
  ['exhaust.diameter', 'fail', 'code', 'IRC M1502.4.1: 4 in nominal'],
  ['exhaust.thickness', 'fail', 'code', 'IRC M1502.4.1: minimum wall thickness'],
  ['exhaust.transition-length', 'fail', 'code', 'IRC M1502.4.3: one transition duct, at most 8 ft'],
  ['exhaust.transition-listed', 'fail', 'code', 'IRC M1502.4.3: listed and labeled'],
  ['exhaust.transition-concealed', 'fail', 'code', 'IRC M1502.4.3: never concealed'],
  ['exhaust.fasteners', 'fail', 'code', 'IRC M1502.4.2: fasteners at most 1/8 in into the duct'],
  ['exhaust.cavity-fit', 'fail', 'code', 'IRC 2018 M1502.4.2: the duct fits its cavity without deforming'],
  ['exhaust.length-label', 'fail', 'code', 'IRC 2018 M1502.4.6: length label'],
  ['exhaust.termination-clearance', 'fail', 'code', 'IRC M1502.3: 3 ft from openings'],
  ['exhaust.backdraft-damper', 'fail', 'code', 'IRC M1502.3: backdraft damper'],
  ['exhaust.no-screen', 'fail', 'code', 'IRC M1502.3: no screen'],
  ['exhaust.booster-fan', 'fail', 'code', 'IRC M1502.4.4 / 2021 M1502.4.5: listed fans only'],
  ['exhaust.termination-location', 'fail', 'code', 'IRC M1502.3 and M1501.1: the duct ends outdoors, never in an attic, soffit, crawl space or garage'],
  ['exhaust.terminal-opening', 'fail', 'code', 'IRC 2018/2021 M1502.3: terminal opening at least 12.5 sq in'],
  ['exhaust.support-spacing', 'fail', 'code', 'IRC M1502.4.2 (2015+): supports at most 12 ft apart'],
  ['exhaust.shield-plates', 'fail', 'code', 'IRC M1502.5: shield plates where the duct is under 1-1/4 in from the framing face'],
  ['makeup-air.closet-opening', 'fail', 'code', 'IMC 2018 504.6: 100 sq in opening in a dryer closet'],
  ['makeup-air.maker-closet-vent', 'fail', 'listing', 'the dryer maker’s closet-vent figures, binding through IRC M1307.1 / G2408.1'],
  ['makeup-air.exhaust-rate', 'fail', 'code', 'IMC 2018 504.6: make-up air over 200 cfm'],
  ['gas.location', 'fail', 'code', 'IRC G2406.2 / IFGC 303.3: prohibited locations, exception for a dedicated space'],
  ['gas.shutoff', 'fail', 'code', 'IRC G2420.5.1 / IFGC 409.5.1: shut-off in the same room within 6 ft'],
  ['gas.connector-length', 'fail', 'code', 'IRC G2422.1.2.1: one connector at most 6 ft'],
  ['gas.makeup-air', 'fail', 'code', 'IRC G2439.5 / IFGC 614.6 (from memory): closet make-up air for a gas dryer'],
  ['electrical.laundry-circuit', 'fail', 'code', 'NEC 210.11(C)(2): 20 A laundry circuit'],
  ['electrical.washer-receptacle-reach', 'fail', 'code', 'NEC 210.50(C): within 6 ft'],
  ['electrical.dryer-receptacle-reach', 'fail', 'code', 'NEC 210.50(C): within 6 ft'],
  ['electrical.receptacle-reachable', 'fail', 'code', 'NEC 422.33 (from memory): the plug stays accessible'],
  ['electrical.washer-gfci', 'fail', 'code', 'NEC 210.8: GFCI in laundry areas'],
  ['electrical.dryer-gfci', 'fail', 'code', 'NEC 2020 210.8(A) / 2023 210.8(D): dryer outlets'],
  ['electrical.afci', 'fail', 'code', 'NEC 210.12(A): AFCI for laundry circuits'],
  ['electrical.dryer-4-wire', 'fail', 'code', 'NEC 250.140: new dryer circuits 4-wire'],
  ['electrical.dryer-disconnect', 'fail', 'code', 'NEC 422.31 (from memory): a hard-wired dryer needs a disconnecting means'],
  ['electrical.dryer-circuit-rating', 'caution', 'common-practice', '30 A for a 5000 W dryer is practice; NEC 220.54 sets the load, not the breaker'],
  ['plumbing.standpipe-height', 'fail', 'code', 'IRC P2706.2 / IPC 802.4 / UPC 804.1: standpipe height'],
  ['plumbing.trap-size', 'fail', 'code', 'IRC Table P3201.7 (from memory): 2 in washer trap'],
  ['plumbing.drain-pan', 'fail', 'code', 'a local amendment requires the pan'],
  ['plumbing.valves-accessible', 'caution', 'under-review', 'rests on the washer maker’s general advice; whether a listing makes it binding is not settled'],
  ['plumbing.hammer-arrestors', 'caution', 'under-review', 'IRC P2903.5 from memory, and whether a washer’s valves count as quick-closing is the AHJ’s call'],
  ['plumbing.leak-shutoff', 'fail', 'code', 'a local amendment requires it'],
  ['plumbing.condensate-drain', 'fail', 'listing', 'the ventless dryer maker’s drain instructions, binding through IRC M1307.1'],
  ['fit.width', 'fail', 'physical', 'the units are wider than the enclosure for their arrangement'],
  ['fit.depth', 'fail', 'physical', 'the units are deeper than the enclosure; the doors would not close'],
  ['fit.height', 'fail', 'physical', 'the units are taller than the enclosure for their arrangement'],
  ['clearances.width', 'fail', 'listing', 'maker’s side clearances: IRC M1307.1 / G2408.1'],
  ['clearances.depth', 'fail', 'listing', 'maker’s front and rear clearances: IRC M1307.1 / G2408.1'],
  ['clearances.height', 'fail', 'listing', 'maker’s top clearance: IRC M1307.1 / G2408.1'],
  ['clearances.rear-zone', 'caution', 'common-practice', 'about 6 in behind the units for the vent elbow, hoses and cord'],
  ['service.opening-width', 'fail', 'physical', 'an opening narrower than the unit keeps it in: IRC M1305.1 appliance access'],
  ['service.removal-width', 'caution', 'common-practice', 'about 1 in to spare around the unit in the opening'],
  ['service.toe-kick', 'fail', 'physical', 'a fixed toe kick keeps the units in: IRC M1305.1 appliance access'],
  ['door-hardware.hinge-arm-room', 'caution', 'common-practice', 'room for hinge arms behind the closed doors'],
  ['door-hardware.hinge-count', 'caution', 'hardware-maker', 'hinge makers’ charts by door height'],
  ['door-hardware.hinge-positions', 'caution', 'hardware-maker', 'hinge makers’ guidance: 60–100 mm from the ends'],
  ['door-hardware.appliance-door-swing', 'caution', 'common-practice', 'open enclosure doors clear the appliance doors'],
];

describe('the severity model', () => {
  const rows = new Map(table.map(([key, severity, basis, why]) => [key, { severity, basis, why }]));

  it('has exactly one row per table key', () => {
    expect(rows.size).toBe(table.length);
  });

  for (const rule of baselineRules) {
    it(`${rule.key} is ${rule.severity}, as the model says`, () => {
      const row = rows.get(rule.key);
      expect(row, `${rule.key} has no row in the severity table: add [key, severity, basis, why]`).toBeDefined();
      expect(rule.severity, row!.why).toBe(row!.severity);
      const model = modelSeverity[row!.basis];
      if (model) expect(row!.severity, `${rule.key}: a ${row!.basis} rule is ${model}`).toBe(model);
      else expect(row!.why.length).toBeGreaterThan(20);
    });
  }

  it('lists no rule the baseline does not have', () => {
    const keys = new Set(baselineRules.map((r) => r.key));
    expect(table.map(([key]) => key).filter((key) => !keys.has(key))).toEqual([]);
  });

  it('a caution never cites only a code section: its source is practice or advice', () => {
    for (const rule of baselineRules.filter((r) => r.severity === 'caution' && rows.get(r.key)?.basis !== 'under-review')) {
      expect(rule.citations.every((c) => c.source === 'common-practice' || c.source === 'manufacturer'), rule.key).toBe(true);
    }
  });
});
