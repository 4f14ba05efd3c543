import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { parsePlan, planInputSchema } from '@/lib/domain/plan';
import { demoPlans, gasWalkInBedroomPlan, hallClosetPassPlan } from '@/tests/fixtures/plans';

function parsed(input: unknown) {
  const r = parsePlan(input);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.plan;
}

describe('parsePlan', () => {
  it('accepts every demo plan', () => {
    for (const demo of demoPlans) expect(parsePlan(demo.plan).ok).toBe(true);
  });

  it('converts mixed-unit lengths to inches (1 ft = 12 in; 1 in = 25.4 mm, NIST SP 811)', () => {
    const plan = parsed(hallClosetPassPlan);
    expect(plan.enclosure?.width).toBe(56); // 4' 8"
    expect(plan.enclosure?.height).toBe(84); // 7 ft
    expect(plan.enclosure?.panelThickness).toBe(0.75); // 3/4
    expect(plan.exhaust?.transition?.length).toBe(60); // 5 ft
    expect(plan.exhaust?.run?.[2]).toEqual({ straight: 144 }); // 12 ft
    expect(plan.exhaust?.run?.[4]).toEqual({ straight: 18 }); // 1' 6"
    expect(plan.makeupAir?.openings?.[1].netFreeArea).toBe(60);
  });

  it('reads bare numbers of a metric plan as millimetres and cm²', () => {
    const plan = parsed(gasWalkInBedroomPlan);
    expect(plan.enclosure?.width).toBe(30); // 762 mm
    expect(plan.enclosure?.depth).toBe(32); // '32 in' stays inches
    expect(plan.gas?.connectorLength).toBe(48);
    // 400 cm² / 6.4516 cm² per sq in (NIST SP 811)
    expect(plan.makeupAir?.openings?.[1].netFreeArea).toBeCloseTo(400 / 6.4516, 9);
  });

  it.each([
    ['30', 30],
    ['30 in', 30],
    [`30"`, 30],
    [`2' 6"`, 30],
    [`2'-6 1/2"`, 30.5],
    ['2 ft 6-1/2 in', 30.5],
    ['29 1/2', 29.5],
    ['29-1/2', 29.5],
    ['5 ft', 60],
    ['762 mm', 30],
    ['76.2 cm', 30],
    ['0.762 m', 30],
  ])('enclosure width %s = %d in', (width, inches) => {
    expect(parsed({ units: 'imperial', enclosure: { width } }).enclosure?.width).toBeCloseTo(inches, 9);
  });

  it('names the field when a length is not a length', () => {
    const r = parsePlan({ units: 'imperial', enclosure: { width: '30 furlongs' } });
    expect(r).toEqual({
      ok: false,
      errors: [
        {
          path: 'enclosure.width',
          message: `Enclosure width: '30 furlongs' is not a length; use e.g. 30 in, 2' 6", 762 mm.`,
        },
      ],
    });
  });

  it('gives paths inside arrays', () => {
    const r = parsePlan({ units: 'imperial', exhaust: { run: [{ straight: 12 }, { elbow: 90 }, { straight: 'far' }] } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => e.path)).toEqual(['exhaust.run.2.straight']);
  });

  it('rejects unknown fields with their path', () => {
    const r = parsePlan({ units: 'imperial', enclosure: { width: 30, colour: 'white' }, pets: 2 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => e.path).sort()).toEqual(['enclosure.colour', 'pets']);
  });

  it('rejects elbow angles other than 45 and 90, and bad receptacle use', () => {
    const r = parsePlan({
      units: 'imperial',
      exhaust: { run: [{ elbow: 30, fitting: 'mitered' }] },
      electrical: { receptacles: [{ serves: 'oven' }] },
    });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => e.path)).toEqual(['exhaust.run.0.elbow', 'electrical.receptacles.0.serves']);
  });

  it('rejects a run item that is both a straight and an elbow, and hinges outside the door', () => {
    const r = parsePlan({
      units: 'imperial',
      exhaust: { run: [{ straight: 12, elbow: 90 }] },
      doors: [{ height: 80, hinges: [3, 82] }],
    });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => e.path)).toEqual(['doors.0.hinges.1', 'exhaust.run.0']);
  });

  it('requires units and accepts a plan with nothing else', () => {
    expect(parsePlan({}).ok).toBe(false);
    expect(parsePlan(null).ok).toBe(false);
    expect(parsed({ units: 'metric' })).toEqual({ units: 'metric' });
  });

  it('produces a JSON Schema with descriptions and closed objects', () => {
    const schema = z.toJSONSchema(planInputSchema) as {
      additionalProperties: boolean;
      properties: Record<string, { description?: string; properties?: Record<string, { description?: string }> }>;
    };
    expect(schema.additionalProperties).toBe(false);
    expect(schema.properties.enclosure.properties?.width.description).toMatch(/Width of the enclosure/);
    for (const [name, property] of Object.entries(schema.properties)) {
      expect(property.description, name).toBeTruthy();
    }
  });
});
