import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { countDrawingElements, drawPlan, DRAWING_ELEMENT_BUDGET } from '@/lib/domain/drawing';
import { defaultParameters } from '@/lib/domain/params';
import {
  findOversizeLists,
  MAX_DOORS,
  MAX_EXHAUST_RUN_PIECES,
  MAX_HINGES_PER_DOOR,
  MAX_MAKEUP_AIR_OPENINGS,
  MAX_MEASURE_TEXT_LENGTH,
  MAX_RECEPTACLES,
  parsePlan,
  parseStoredPlan,
  planInputSchema,
  truncateToLimits,
  type Plan,
} from '@/lib/domain/plan';
import { hallClosetPassPlan, largestAllowedPlan } from '@/tests/fixtures/plans';

// The limits are NookPass's own product limits (lib/domain/plan/registry.ts), common practice, no published source;
// these tests hold the schema, the stored-plan reader and the drawings to the same exported numbers.

const door = { kind: 'hinged', width: 20, height: 78, thickness: 0.75, hinges: [3, 75] };
const times = <T>(n: number, make: (i: number) => T) => Array.from({ length: n }, (_, i) => make(i));

const lists = [
  { path: 'doors', max: MAX_DOORS, plan: (n: number) => ({ units: 'imperial', doors: times(n, () => door) }) },
  { path: 'doors.0.hinges', max: MAX_HINGES_PER_DOOR, plan: (n: number) => ({ units: 'imperial', doors: [{ ...door, hinges: times(n, (i) => 1 + (i % 70)) }] }) },
  { path: 'exhaust.run', max: MAX_EXHAUST_RUN_PIECES, plan: (n: number) => ({ units: 'imperial', exhaust: { run: times(n, () => ({ straight: 6 })) } }) },
  { path: 'makeupAir.openings', max: MAX_MAKEUP_AIR_OPENINGS, plan: (n: number) => ({ units: 'imperial', makeupAir: { openings: times(n, () => ({ position: 'top', netFreeArea: 10 })) } }) },
  { path: 'electrical.receptacles', max: MAX_RECEPTACLES, plan: (n: number) => ({ units: 'imperial', electrical: { receptacles: times(n, () => ({ serves: 'washer', volts: 120, amps: 20 })) } }) },
];

describe('plan list limits', () => {
  it.each(lists)('$path: $max accepted, one more refused with the path and the limit', ({ path, max, plan }) => {
    expect(parsePlan(plan(max)).ok).toBe(true);
    const r = parsePlan(plan(max + 1));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors).toEqual([{ path, message: expect.stringContaining(`at most ${max} `) }]);
    expect(r.errors[0].message).toContain(`this plan has ${max + 1}`);
  });

  it('refuses 100,000 hinges on one door with a single error, quickly', () => {
    const started = performance.now();
    const r = parsePlan({ units: 'imperial', doors: [{ ...door, hinges: times(100_000, (i) => 1 + (i % 70)) }] });
    expect(performance.now() - started).toBeLessThan(1_000);
    expect(r).toEqual({ ok: false, errors: [{ path: 'doors.0.hinges', message: expect.stringMatching(/at most 12 hinge positions on a door; this plan has 100,000\.$/) }] });
  });

  it('accepts the largest plan the limits allow', () => {
    const r = parsePlan(largestAllowedPlan);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.plan.doors?.map((d) => d.hinges?.length)).toEqual(times(MAX_DOORS, () => MAX_HINGES_PER_DOOR));
  });
});

describe('measure text limit', () => {
  it(`accepts ${MAX_MEASURE_TEXT_LENGTH} characters and refuses one more, naming the field`, () => {
    const atLimit = '30 in'.padStart(MAX_MEASURE_TEXT_LENGTH, ' ');
    expect(parsePlan({ units: 'imperial', enclosure: { width: atLimit } })).toMatchObject({ ok: true, plan: { enclosure: { width: 30 } } });
    const r = parsePlan({ units: 'imperial', enclosure: { width: ` ${atLimit}` }, makeupAir: { openings: [{ netFreeArea: 'x'.repeat(5_000) }] } });
    expect(r).toEqual({
      ok: false,
      errors: [
        { path: 'enclosure.width', message: `Enclosure width: at most ${MAX_MEASURE_TEXT_LENGTH} characters; this has ${MAX_MEASURE_TEXT_LENGTH + 1}.` },
        { path: 'makeupAir.openings.0.netFreeArea', message: `Opening 1, net free area: at most ${MAX_MEASURE_TEXT_LENGTH} characters; this has 5,000.` },
      ],
    });
  });
});

describe('the JSON Schema of a plan', () => {
  it('states every list limit as maxItems and the text limit as maxLength', () => {
    const schema = z.toJSONSchema(planInputSchema, { io: 'input', unrepresentable: 'any' }) as any;
    const p = schema.properties;
    expect(p.doors.maxItems).toBe(MAX_DOORS);
    expect(p.doors.items.properties.hinges.maxItems).toBe(MAX_HINGES_PER_DOOR);
    expect(p.exhaust.properties.run.maxItems).toBe(MAX_EXHAUST_RUN_PIECES);
    expect(p.makeupAir.properties.openings.maxItems).toBe(MAX_MAKEUP_AIR_OPENINGS);
    expect(p.electrical.properties.receptacles.maxItems).toBe(MAX_RECEPTACLES);
    expect(p.enclosure.properties.width.anyOf).toContainEqual({ type: 'string', maxLength: MAX_MEASURE_TEXT_LENGTH });
  });
});

describe('stored plans over the limits', () => {
  const stored = {
    ...hallClosetPassPlan,
    doors: times(5_000, () => ({ ...door, hinges: times(100, (i) => 1 + (i % 70)) })),
    exhaust: { ...hallClosetPassPlan.exhaust, run: times(16_000, () => ({ straight: 6 })) },
  };

  it('are read, cut to the limits, with each list over its limit named', () => {
    const before = JSON.stringify(stored);
    const r = parseStoredPlan(stored);
    expect(JSON.stringify(stored)).toBe(before); // the stored value itself is not changed
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.plan.doors).toHaveLength(MAX_DOORS);
    expect(r.plan.doors?.every((d) => d.hinges?.length === MAX_HINGES_PER_DOOR)).toBe(true);
    expect(r.plan.exhaust?.run).toHaveLength(MAX_EXHAUST_RUN_PIECES);
    expect(r.oversize.map((o) => [o.path, o.count, o.max])).toEqual([
      ['doors', 5_000, MAX_DOORS],
      // Hinges are counted on the doors that survive the cut only: one line per door kept, not 5,000.
      ...times(MAX_DOORS, (i) => [`doors.${i}.hinges`, 100, MAX_HINGES_PER_DOOR]),
      ['exhaust.run', 16_000, MAX_EXHAUST_RUN_PIECES],
    ]);
    expect(r.oversize[0].message).toBe('Doors: at most 8 doors; this plan has 5,000.');
  });

  it('within the limits read exactly as new input does, with nothing over', () => {
    expect(parseStoredPlan(hallClosetPassPlan)).toEqual({ ...parsePlan(hallClosetPassPlan), oversize: [] });
    expect(truncateToLimits(hallClosetPassPlan)).toBe(hallClosetPassPlan);
  });

  it('with a text longer than today\'s limit still read when it is a length', () => {
    const r = parseStoredPlan({ units: 'imperial', enclosure: { width: '30 in'.padStart(MAX_MEASURE_TEXT_LENGTH + 20, ' ') } });
    expect(r).toMatchObject({ ok: true, plan: { enclosure: { width: 30 } }, oversize: [] });
  });
});

describe('drawings under a budget', () => {
  const params = defaultParameters({ building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' });
  const canonical = (input: unknown): Plan => {
    const r = parsePlan(input);
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    return r.plan;
  };

  it('draw the largest plan the limits allow within the element budget', () => {
    const r = drawPlan(canonical(largestAllowedPlan), { params });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.drawings.hinges).toHaveLength(MAX_DOORS);
    expect(r.elements).toBe(countDrawingElements(r.drawings));
    expect(r.elements).toBeLessThan(DRAWING_ELEMENT_BUDGET);
  });

  it('refuse a plan over the list limits before drawing, naming the list', () => {
    const plan = canonical(hallClosetPassPlan);
    plan.doors![0].hinges = times(100_000, (i) => 1 + (i % 70));
    const started = performance.now();
    const r = drawPlan(plan, { params });
    expect(performance.now() - started).toBeLessThan(500);
    expect(r).toEqual({ ok: false, reasons: ['Door 1, hinge positions: at most 12 hinge positions on a door; this plan has 100,000.'] });
  });

  it('refuse geometry over the budget with a message', () => {
    const r = drawPlan(canonical(hallClosetPassPlan), { params }, 50);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reasons[0]).toMatch(/^The drawings would have [\d,]+ elements; the most NookPass draws for one plan is 50\.$/);
  });
});

describe('findOversizeLists', () => {
  it('counts without parsing, and ignores lists of the wrong type', () => {
    expect(findOversizeLists({ doors: 'many', exhaust: { run: { length: 1e9 } } })).toEqual([]);
    expect(findOversizeLists({ makeupAir: { openings: times(13, () => null) } })).toEqual([
      { path: 'makeupAir.openings', count: 13, max: 12, message: 'Make-up air openings: at most 12 make-up air openings; this plan has 13.' },
    ]);
  });
});
