import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluate } from '@/lib/domain/engine';
import type { Editions } from '@/lib/domain/editions';
import { parsePlan } from '@/lib/domain/plan';
import { baselineRules, buildRuleSet } from '@/rules';
import { EDITIONS_2018, EDITIONS_2021 } from './support/check';

const length = fc.oneof(
  fc.double({ min: 0, max: 3000, noNaN: true }),
  fc.integer({ min: 0, max: 400 }).map((n) => `${n} in`),
  fc
    .tuple(fc.integer({ min: 0, max: 40 }), fc.integer({ min: 0, max: 11 }), fc.constantFrom('', ' 1/2', '-3/4', ' 1/16'))
    .map(([feet, inches, fraction]) => `${feet}' ${inches}${fraction}"`),
  fc.integer({ min: 0, max: 9000 }).map((n) => `${n} mm`),
  fc.integer({ min: 0, max: 30 }).map((n) => `${n} ft`),
);
const area = fc.oneof(
  fc.double({ min: 0, max: 1000, noNaN: true }),
  fc.integer({ min: 0, max: 500 }).map((n) => `${n} sq in`),
  fc.integer({ min: 0, max: 3000 }).map((n) => `${n} cm²`),
);
const opt = <T>(arb: fc.Arbitrary<T>) => fc.option(arb, { nil: undefined });
const partial = <T extends Record<string, fc.Arbitrary<unknown>>>(model: T) => fc.record(model, { requiredKeys: [] });

const clearances = partial({ side: length, top: length, rear: length, front: length });
const appliance = { width: length, depth: length, height: length, frontProjection: length, clearances };
const runItem = fc.oneof(
  fc.record({ straight: length }),
  fc.record({ elbow: fc.constantFrom(45 as const, 90 as const), fitting: opt(fc.constantFrom('mitered', 'smooth-6in', 'smooth-8in', 'smooth-10in', 'other')) }, { requiredKeys: ['elbow'] }),
);
const door = fc
  .record({ height: fc.integer({ min: 20, max: 3000 }), width: fc.integer({ min: 10, max: 1000 }), thickness: fc.integer({ min: 0, max: 50 }) })
  .chain((d) =>
    fc.record({
      kind: opt(fc.constantFrom('hinged', 'bifold', 'sliding')),
      width: fc.constant(d.width),
      height: fc.constant(d.height),
      thickness: fc.constant(d.thickness),
      hinges: opt(fc.array(fc.integer({ min: 1, max: d.height - 1 }), { maxLength: 6 })),
    }),
  );
const receptacle = partial({
  serves: fc.constantFrom('washer', 'dryer', 'both'),
  volts: fc.constantFrom(120, 240),
  amps: fc.constantFrom(15, 20, 30, 50),
  wires: fc.constantFrom(3 as const, 4 as const),
  gfci: fc.boolean(),
  afci: fc.boolean(),
  distanceToAppliance: length,
  reachableInstalled: fc.boolean(),
  existingCircuit: fc.boolean(),
});

const validPlan = fc.record(
  {
    units: fc.constantFrom('imperial', 'metric'),
    space: partial({
      kind: fc.constantFrom('laundry-room', 'walk-in-closet', 'hall-closet', 'storage-closet', 'cabinet', 'bathroom'),
      opensInto: fc.constantFrom('hallway', 'bedroom', 'bathroom', 'kitchen', 'other'),
      overFinishedSpace: fc.boolean(),
    }),
    arrangement: fc.constantFrom('side-by-side', 'stacked'),
    enclosure: partial({
      width: length,
      depth: length,
      height: length,
      depthMeasured: fc.constantFrom('outside', 'inside'),
      panelThickness: length,
      openingWidth: length,
      toeKick: fc.option(partial({ height: length, removable: fc.boolean() }), { nil: null }),
    }),
    washer: partial(appliance),
    dryer: partial({
      ...appliance,
      fuel: fc.constantFrom('electric', 'gas'),
      exhaustCfm: fc.integer({ min: 0, max: 400 }),
      maxDuctLength: fc.option(length, { nil: null }),
      closetVent: fc.option(partial({ top: area, bottom: area }), { nil: null }),
    }),
    exhaust: partial({
      material: fc.constantFrom('rigid-metal', 'semi-rigid-metal', 'flexible-foil'),
      diameter: length,
      thickness: length,
      transition: partial({ length, listed: fc.boolean(), concealed: fc.boolean() }),
      run: fc.array(runItem, { maxLength: 8 }),
      concealed: fc.boolean(),
      cavityDepth: length,
      lengthLabel: fc.boolean(),
      fastenersIntoAirstream: fc.boolean(),
      fastenerProtrusion: length,
      termination: partial({ clearanceToOpenings: length, backdraftDamper: fc.boolean(), screen: fc.boolean() }),
      boosterFan: fc.option(partial({ kind: fc.constantFrom('power-ventilator', 'booster'), listed: fc.boolean(), maxDuctLength: length }), { nil: null }),
    }),
    makeupAir: partial({
      openings: fc.array(partial({ position: fc.constantFrom('top', 'bottom', 'side'), netFreeArea: area }), { maxLength: 4 }),
      providedCfm: fc.integer({ min: 0, max: 400 }),
    }),
    electrical: partial({
      laundryCircuit: partial({ amps: fc.constantFrom(15, 20), dedicated: fc.boolean() }),
      receptacles: fc.array(receptacle, { maxLength: 3 }),
    }),
    plumbing: partial({
      standpipeHeight: length,
      trapSize: length,
      drainPan: fc.option(partial({ present: fc.boolean(), drainsTo: fc.constantFrom('indirect-waste', 'floor-drain', 'none') }), { nil: null }),
      valvesAccessible: fc.boolean(),
      hammerArrestors: fc.boolean(),
      leakShutoff: fc.boolean(),
    }),
    gas: fc.option(partial({ shutoffDistance: length, shutoffSameRoom: fc.boolean(), connectorLength: length }), { nil: null }),
    doors: fc.array(door, { maxLength: 3 }),
  },
  { requiredKeys: ['units'] },
);

const upc: Editions = { ...EDITIONS_2018, plumbing: 'UPC 2021', plumbingFamily: 'UPC', electrical: 'NEC 2023' };
const old: Editions = { ...EDITIONS_2018, building: 'IRC 2009', electrical: 'NEC 2011' };
const ruleSets = [EDITIONS_2018, EDITIONS_2021, upc, old].map((editions) => buildRuleSet(editions));

describe('property: random valid plans', () => {
  it('parse, never throw, and give exactly one finding per enabled rule', async () => {
    await fc.assert(
      fc.asyncProperty(
        validPlan,
        fc.constantFrom(...ruleSets),
        fc.subarray(baselineRules.map((r) => r.key)),
        async (input, ruleSet, disabled) => {
          const parsed = parsePlan(input);
          expect(parsed.ok, JSON.stringify(parsed.ok ? null : parsed.errors)).toBe(true);
          if (!parsed.ok) return;
          const rules = ruleSet.rules.map((r) => ({ ...r, enabled: !disabled.includes(r.key) }));
          const evaluation = await evaluate({ jurisdiction: 'P', version: 1, parameters: ruleSet.parameters, rules }, parsed.plan);
          const enabled = rules.filter((r) => r.enabled).map((r) => r.key);
          expect(evaluation.findings.map((f) => f.ruleKey)).toEqual(enabled);
          const s = evaluation.summary;
          expect(s.pass + s.fail + s.caution + s.needsInfo + s.notApplicable).toBe(enabled.length);
          for (const f of evaluation.findings) {
            if (f.status === 'needs-info') expect(f.remedy).toBeNull();
            if (f.status === 'pass' || f.status === 'not-applicable') expect(f.remedy).toBeNull();
            expect(f.message.length).toBeGreaterThan(0);
          }
        },
      ),
      { numRuns: 300 },
    );
  });
});

type Defect = (plan: Record<string, unknown>) => void;
const defects: fc.Arbitrary<Defect> = fc.oneof(
  fc.string({ minLength: 1, maxLength: 8 }).filter((k) => /^[a-z]+$/.test(k) && !['units', 'space', 'gas', 'doors', 'washer', 'dryer', 'exhaust', 'plumbing', 'electrical', 'enclosure', 'makeupAir', 'arrangement'].includes(k)).map(
    (key): Defect => (plan) => {
      plan[key] = 1;
    },
  ),
  fc.constantFrom<Defect>(
    (plan) => {
      plan.enclosure = { ...(plan.enclosure as object), width: '30 furlongs' };
    },
    (plan) => {
      plan.enclosure = { ...(plan.enclosure as object), depth: -3 };
    },
    (plan) => {
      plan.exhaust = { ...(plan.exhaust as object), run: [{ straight: 'long' }] };
    },
    (plan) => {
      plan.exhaust = { ...(plan.exhaust as object), run: [{ elbow: 60 }] };
    },
    (plan) => {
      plan.dryer = { ...(plan.dryer as object), fuel: 'wood' };
    },
    (plan) => {
      plan.units = 'cubits';
    },
    (plan) => {
      plan.washer = { ...(plan.washer as object), colour: 'white' };
    },
    (plan) => {
      plan.doors = [{ height: 80, hinges: [90] }];
    },
    (plan) => {
      plan.makeupAir = { openings: [{ netFreeArea: '12 furlongs' }] };
    },
  ),
);

describe('property: random invalid plans', () => {
  it('always give errors, each with a non-empty path and message', () => {
    fc.assert(
      fc.property(validPlan, defects, (input, defect) => {
        const plan = structuredClone(input) as Record<string, unknown>;
        defect(plan);
        const parsed = parsePlan(plan);
        expect(parsed.ok).toBe(false);
        if (parsed.ok) return;
        expect(parsed.errors.length).toBeGreaterThan(0);
        for (const error of parsed.errors) {
          expect(error.path.length).toBeGreaterThan(0);
          expect(error.message.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 300 },
    );
  });
});
