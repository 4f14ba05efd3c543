import { describe, expect, it } from 'vitest';
import type { Editions } from '@/lib/domain/editions';
import { baselineRules, type RuleSetOverrides } from '@/rules';
import { EDITIONS_2021, findingFor, variant, type LoosePlan } from './support/check';

interface RuleCase {
  key: string;
  pass: (p: LoosePlan) => void;
  fail: (p: LoosePlan) => void;
  editions?: Editions;
  overrides?: RuleSetOverrides;
}

const none = () => {};
const gasDryer = (p: LoosePlan) => {
  p.dryer.fuel = 'gas';
  p.gas = { shutoffDistance: '4 ft', shutoffSameRoom: true, connectorLength: '4 ft' };
  p.electrical.receptacles[1] = { serves: 'dryer', volts: 120, amps: 20, gfci: true, afci: true, distanceToAppliance: 24, reachableInstalled: true };
};
const panRequired: RuleSetOverrides = { parameters: { plumbing: { drainPanPolicy: 'over-finished-space', drainPanSection: '406.3' } } };

// One passing and one failing plan per baseline rule; the source of each number is named beside it.
const cases: RuleCase[] = [
  // IRC 2018 M1502.4.5.1 and Table M1502.4.5.1: 35 ft; mitered 90° = 5 ft.
  {
    key: 'exhaust.developed-length',
    pass: (p) => (p.exhaust.run = [{ straight: '30 ft' }, { elbow: 90, fitting: 'mitered' }]), // 35 ft exactly
    fail: (p) => (p.exhaust.run = [{ straight: `30' 1"` }, { elbow: 90, fitting: 'mitered' }]), // 35 ft 1 in
  },
  // IRC M1502.4.1: rigid metal, smooth interior.
  { key: 'exhaust.material', pass: none, fail: (p) => (p.exhaust.material = 'flexible-foil') },
  // IRC M1502.4.1: 4 in nominal.
  { key: 'exhaust.diameter', pass: (p) => (p.exhaust.diameter = '100 mm'), fail: (p) => (p.exhaust.diameter = 3) },
  // IRC 2018 M1502.4.1: 0.0157 in (No. 28 gage) minimum.
  { key: 'exhaust.thickness', pass: (p) => (p.exhaust.thickness = '0.0157 in'), fail: (p) => (p.exhaust.thickness = '0.015 in') },
  // IRC M1502.4.3: transition duct at most 8 ft.
  { key: 'exhaust.transition-length', pass: (p) => (p.exhaust.transition.length = '8 ft'), fail: (p) => (p.exhaust.transition.length = `8' 1"`) },
  // IRC M1502.4.3: listed and labeled (UL 2158A).
  { key: 'exhaust.transition-listed', pass: none, fail: (p) => (p.exhaust.transition.listed = false) },
  // IRC M1502.4.3: not concealed in construction.
  { key: 'exhaust.transition-concealed', pass: none, fail: (p) => (p.exhaust.transition.concealed = true) },
  // IRC 2018 M1502.4.2: fasteners no more than 1/8 in into the duct.
  {
    key: 'exhaust.fasteners',
    pass: (p) => Object.assign(p.exhaust, { fastenersIntoAirstream: true, fastenerProtrusion: '1/8' }),
    fail: (p) => Object.assign(p.exhaust, { fastenersIntoAirstream: true, fastenerProtrusion: '3/16' }),
  },
  // IRC 2018 M1502.4.2; PS 20 lumber: 2x4 = 3-1/2 in, 2x6 = 5-1/2 in.
  { key: 'exhaust.cavity-fit', pass: (p) => (p.exhaust.cavityDepth = '5-1/2'), fail: (p) => (p.exhaust.cavityDepth = '3-1/2') },
  // IRC 2018 M1502.4.6: label where the length exceeds 35 ft (maker's 50 ft allowance in use).
  {
    key: 'exhaust.length-label',
    pass: (p) => {
      p.dryer.maxDuctLength = '50 ft';
      p.exhaust.run = [{ straight: '40 ft' }];
    },
    fail: (p) => {
      p.dryer.maxDuctLength = '50 ft';
      p.exhaust.run = [{ straight: '40 ft' }];
      p.exhaust.lengthLabel = false;
    },
  },
  // IRC M1502.3: 3 ft from openings into the building.
  { key: 'exhaust.termination-clearance', pass: (p) => (p.exhaust.termination.clearanceToOpenings = '3 ft'), fail: (p) => (p.exhaust.termination.clearanceToOpenings = `2' 11"`) },
  // IRC M1502.3: backdraft damper.
  { key: 'exhaust.backdraft-damper', pass: none, fail: (p) => (p.exhaust.termination.backdraftDamper = false) },
  // IRC M1502.3: no screen.
  { key: 'exhaust.no-screen', pass: none, fail: (p) => (p.exhaust.termination.screen = true) },
  // IRC 2018 M1502.4.4: a listed fan installed per its listing.
  {
    key: 'exhaust.booster-fan',
    pass: (p) => (p.exhaust.boosterFan = { kind: 'booster', listed: true }),
    fail: (p) => (p.exhaust.boosterFan = { kind: 'booster', listed: false }),
  },
  // IRC M1502.3 (and M1501.1): the duct ends outdoors, never in an attic (TRADE.md S).
  { key: 'exhaust.termination-location', pass: none, fail: (p) => (p.exhaust.termination.location = 'attic') },
  // IRC 2018 M1502.3: terminal opening at least 12.5 sq in (TRADE.md S).
  {
    key: 'exhaust.terminal-opening',
    pass: (p) => (p.exhaust.termination.openingArea = '12.5 sq in'),
    fail: (p) => (p.exhaust.termination.openingArea = '12.4 sq in'),
  },
  // IRC 2018 M1502.4.2: supports at most 12 ft apart (TRADE.md S).
  { key: 'exhaust.support-spacing', pass: (p) => (p.exhaust.supportSpacing = '12 ft'), fail: (p) => (p.exhaust.supportSpacing = `12' 1"`) },
  // IRC M1502.5: shield plates where the duct is less than 1-1/4 in from the framing face (TRADE.md S).
  {
    key: 'exhaust.shield-plates',
    pass: (p) => Object.assign(p.exhaust, { framingFaceClearance: '1-1/4', shieldPlates: false }),
    fail: (p) => Object.assign(p.exhaust, { framingFaceClearance: '1-1/8', shieldPlates: false }),
  },
  // IMC 2018 504.6: closet for a dryer, opening of at least 100 sq in.
  {
    key: 'makeup-air.closet-opening',
    pass: (p) => (p.makeupAir.openings = [{ position: 'top', netFreeArea: 50 }, { position: 'bottom', netFreeArea: 50 }]),
    fail: (p) => (p.makeupAir.openings = [{ position: 'top', netFreeArea: 50 }, { position: 'bottom', netFreeArea: 49 }]),
  },
  // Manufacturer's instructions: the plan's maker figures, 48 sq in top and 24 sq in bottom.
  {
    key: 'makeup-air.maker-closet-vent',
    pass: (p) => (p.makeupAir.openings = [{ position: 'top', netFreeArea: 48 }, { position: 'bottom', netFreeArea: 52 }]),
    fail: (p) => (p.makeupAir.openings = [{ position: 'top', netFreeArea: 47 }, { position: 'bottom', netFreeArea: 60 }]),
  },
  // IMC 2018 504.6: exhaust over 200 cfm needs make-up air.
  {
    key: 'makeup-air.exhaust-rate',
    pass: (p) => Object.assign(p.dryer, { exhaustCfm: 240 }, (p.makeupAir.providedCfm = 240) && {}),
    fail: (p) => Object.assign(p.dryer, { exhaustCfm: 240 }, (p.makeupAir.providedCfm = 100) && {}),
  },
  // IRC G2406.2 / IFGC 303.3: not in a space opening only into a bedroom unless it meets the exception, which a
  // walk-in clothes closet never does (it is used for storage).
  {
    key: 'gas.location',
    pass: gasDryer,
    fail: (p) => {
      gasDryer(p);
      Object.assign(p.space, { kind: 'walk-in-closet', opensInto: 'bedroom', dedicatedToLaundry: true, door: { solid: true, weatherStripped: true, selfClosing: true } });
      p.gas.combustionAirFromOutdoors = true;
    },
  },
  // IFGC 2018 409.5.1: same room, within 6 ft.
  {
    key: 'gas.shutoff',
    pass: (p) => {
      gasDryer(p);
      p.gas.shutoffDistance = '6 ft';
    },
    fail: (p) => {
      gasDryer(p);
      p.gas.shutoffDistance = `6' 1"`;
    },
  },
  // IRC G2422.1.2.1 (IFGC number from memory): connector at most 6 ft.
  {
    key: 'gas.connector-length',
    pass: (p) => {
      gasDryer(p);
      p.gas.connectorLength = '6 ft';
    },
    fail: (p) => {
      gasDryer(p);
      p.gas.connectorLength = '7 ft';
    },
  },
  // IRC G2439.5 / IFGC 614.6 (from memory): closet make-up air for a gas dryer, 100 sq in.
  {
    key: 'gas.makeup-air',
    pass: gasDryer,
    fail: (p) => {
      gasDryer(p);
      p.makeupAir.openings = [{ position: 'bottom', netFreeArea: 99 }];
    },
  },
  // NEC 210.11(C)(2): a 20 A laundry circuit with no other outlets.
  { key: 'electrical.laundry-circuit', pass: none, fail: (p) => (p.electrical.laundryCircuit.dedicated = false) },
  // NEC 210.50(C): within 6 ft.
  { key: 'electrical.washer-receptacle-reach', pass: (p) => (p.electrical.receptacles[0].distanceToAppliance = '6 ft'), fail: (p) => (p.electrical.receptacles[0].distanceToAppliance = `6' 1"`) },
  { key: 'electrical.dryer-receptacle-reach', pass: (p) => (p.electrical.receptacles[1].distanceToAppliance = 72), fail: (p) => (p.electrical.receptacles[1].distanceToAppliance = 73) },
  // NEC 422.33 (from memory): the plug stays accessible.
  { key: 'electrical.receptacle-reachable', pass: none, fail: (p) => (p.electrical.receptacles[1].reachableInstalled = false) },
  // NEC 2017 210.8(A)(10): laundry-area 125-V receptacles.
  { key: 'electrical.washer-gfci', pass: none, fail: (p) => (p.electrical.receptacles[0].gfci = false) },
  // NEC 2020 210.8(A): 250-V receptacles too.
  { key: 'electrical.dryer-gfci', editions: EDITIONS_2021, pass: none, fail: (p) => (p.electrical.receptacles[1].gfci = false) },
  // NEC 2017 210.12(A): AFCI for laundry 120-V 15/20-A circuits.
  { key: 'electrical.afci', pass: none, fail: (p) => (p.electrical.receptacles[0].afci = false) },
  // NEC 250.140: new dryer circuits 4-wire; 3-wire only on existing circuits.
  {
    key: 'electrical.dryer-4-wire',
    pass: (p) => Object.assign(p.electrical.receptacles[1], { wires: 3, existingCircuit: true }),
    fail: (p) => (p.electrical.receptacles[1].wires = 3),
  },
  // common practice, no published source: 30 A for a 5000 W (NEC 220.54) dryer.
  { key: 'electrical.dryer-circuit-rating', pass: none, fail: (p) => (p.electrical.receptacles[1].amps = 20) },
  // NEC 422.31 (from memory, TRADE.md M): a hard-wired dryer needs a disconnecting means.
  {
    key: 'electrical.dryer-disconnect',
    pass: (p) => Object.assign(p.electrical.receptacles[1], { hardWired: true, disconnect: 'lockable-breaker' }),
    fail: (p) => Object.assign(p.electrical.receptacles[1], { hardWired: true, disconnect: 'none' }),
  },
  // IPC 802.4 / IRC P2706.2: 18 in to 42 in above the trap weir.
  { key: 'plumbing.standpipe-height', pass: (p) => (p.plumbing.standpipeHeight = '42 in'), fail: (p) => (p.plumbing.standpipeHeight = `3' 7"`) },
  // IRC Table P3201.7 (from memory): 2 in washer trap.
  { key: 'plumbing.trap-size', pass: (p) => (p.plumbing.trapSize = '50 mm'), fail: (p) => (p.plumbing.trapSize = '1-1/2') },
  // Local amendment (e.g. Baltimore City IPC 406.3): pan drained to a receptor where leaks can damage the structure.
  {
    key: 'plumbing.drain-pan',
    overrides: panRequired,
    pass: none,
    fail: (p) => (p.plumbing.drainPan = { present: true, drainsTo: 'none' }),
  },
  // Manufacturer's instructions: supply valves within reach.
  { key: 'plumbing.valves-accessible', pass: none, fail: (p) => (p.plumbing.valvesAccessible = false) },
  // IRC P2903.5 (from memory): water-hammer arrestors for quick-closing valves.
  { key: 'plumbing.hammer-arrestors', pass: none, fail: (p) => (p.plumbing.hammerArrestors = false) },
  // Local amendment: leak shut-off where required.
  {
    key: 'plumbing.leak-shutoff',
    overrides: { parameters: { plumbing: { leakShutoffPolicy: 'always' } } },
    pass: none,
    fail: (p) => (p.plumbing.leakShutoff = false),
  },
  // Manufacturer's instructions (binding under IRC M1307.1, TRADE.md S): a heat-pump dryer's drain hose to a receptor within its reach.
  {
    key: 'plumbing.condensate-drain',
    pass: (p) => Object.assign(p.dryer, { type: 'heat-pump', condensate: 'drain', condensateDrainTo: 'standpipe', condensateDrainReachable: true }),
    fail: (p) => Object.assign(p.dryer, { type: 'heat-pump', condensate: 'drain', condensateDrainTo: 'standpipe', condensateDrainReachable: false }),
  },
  // Physical fit, the plan's own sizes: 24 + 24 in units side by side = 48 in; 56 in outside less two 3/4 in
  // panels = 54-1/2 in inside. Fails at 44-1/2 in inside (46 in outside).
  { key: 'fit.width', pass: (p) => (p.enclosure.width = 49.5), fail: (p) => (p.enclosure.width = 46) },
  // Physical fit: 24 in cabinet + 2 in knobs and door = 26 in; outside depth less a 3/4 in back and a 3/4 in door.
  { key: 'fit.depth', pass: (p) => (p.enclosure.depth = 27.5), fail: (p) => (p.enclosure.depth = 27.4) },
  // Physical fit: a stacked pair of 34 in units = 68 in; outside height less a 3/4 in top. Fails at 60 in.
  {
    key: 'fit.height',
    pass: (p) => Object.assign(p, { arrangement: 'stacked' }, (p.enclosure.height = 68.75) && {}),
    fail: (p) => Object.assign(p, { arrangement: 'stacked' }, (p.enclosure.height = 60) && {}),
  },
  // IRC M1305.1: the units come out without removing permanent construction; widest unit 24 in.
  { key: 'service.opening-width', pass: (p) => (p.enclosure.openingWidth = 24), fail: (p) => (p.enclosure.openingWidth = 23.9) },
  // IRC M1307.1, maker's instructions (plan's figures): 24 + 24 + three 1-in gaps = 51 in.
  { key: 'clearances.width', pass: (p) => (p.enclosure.width = 52.5), fail: (p) => (p.enclosure.width = 52.4) },
  // IRC M1307.1, maker's instructions: 24 + 2 + 1 + 4 = 31 in inside; outside adds back panel and door (3/4 in each).
  { key: 'clearances.depth', pass: (p) => (p.enclosure.depth = 32.5), fail: (p) => (p.enclosure.depth = 32.4) },
  // IRC M1307.1, maker's instructions: 34 + 1 = 35 in inside, plus a 3/4 in top panel outside.
  { key: 'clearances.height', pass: (p) => (p.enclosure.height = 35.75), fail: (p) => (p.enclosure.height = 35.7) },
  // common practice, no published source: about 6 in behind the units.
  { key: 'clearances.rear-zone', pass: (p) => (p.enclosure.depth = 34.5), fail: (p) => (p.enclosure.depth = 34.4) },
  // common practice, no published source: opening at least unit width + 1 in.
  { key: 'service.removal-width', pass: (p) => (p.enclosure.openingWidth = 25), fail: (p) => (p.enclosure.openingWidth = 24.9) },
  // IRC M1305.1: a fixed toe kick keeps the units in.
  { key: 'service.toe-kick', pass: none, fail: (p) => (p.enclosure.toeKick.removable = false) },
  // common practice, no published source: 2 in for hinge arms (front gap = inside depth - 24 - 2 - 4).
  { key: 'door-hardware.hinge-arm-room', pass: (p) => (p.enclosure.depth = 33.5), fail: (p) => (p.enclosure.depth = 33.4) },
  // Hinge makers' charts: 4 hinges up to 2000 mm, 5 up to 2500 mm.
  {
    key: 'door-hardware.hinge-count',
    pass: none,
    fail: (p) => {
      p.doors[0].height = '2010 mm';
      p.doors[0].hinges = ['76 mm', '650 mm', '1300 mm', '1934 mm'];
    },
  },
  // Hinge makers' guidance: cup centre 60-100 mm from the door ends.
  {
    key: 'door-hardware.hinge-positions',
    pass: (p) => (p.doors[0].hinges = ['60 mm', 27, 51, '1881.2 mm']), // 78 in door = 1981.2 mm; top hinge 100 mm down
    fail: (p) => (p.doors[0].hinges = ['59 mm', 27, 51, 75]),
  },
  // common practice, no published source: hinged leaves open to 90° intrude by their thickness.
  { key: 'door-hardware.appliance-door-swing', pass: (p) => (p.enclosure.width = 51), fail: (p) => (p.enclosure.width = 50.9) },
];

describe('baseline rules, one pass and one fail each', () => {
  it('covers every baseline rule', () => {
    expect(cases.map((c) => c.key).sort()).toEqual(baselineRules.map((r) => r.key).sort());
  });

  for (const ruleCase of cases) {
    const rule = baselineRules.find((r) => r.key === ruleCase.key)!;
    it(`${ruleCase.key} passes`, async () => {
      const f = await findingFor(ruleCase.key, variant(ruleCase.pass), ruleCase.editions, ruleCase.overrides);
      expect(f.status, f.message).toBe('pass');
      expect(f.remedy).toBeNull();
    });
    it(`${ruleCase.key} ${rule.severity === 'fail' ? 'fails' : 'cautions'}`, async () => {
      const f = await findingFor(ruleCase.key, variant(ruleCase.fail), ruleCase.editions, ruleCase.overrides);
      expect(f.status, f.message).toBe(rule.severity);
      expect(f.failedCondition).toBeTruthy();
      expect(f.remedy).toBeTruthy();
      expect(f.note).toMatch(/AHJ govern/);
    });
  }
});
