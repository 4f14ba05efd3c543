import { describe, expect, it } from 'vitest';
import { boundsOf, dimensionGeometry, frame, frontElevation, planView, type RectShape, type Shape } from '@/lib/domain/drawing';
import { computeFacts } from '@/lib/domain/facts';
import { defaultParameters } from '@/lib/domain/params';
import { parsePlan, type Plan } from '@/lib/domain/plan';
import { gasWalkInBedroomPlan, hallClosetPassPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';
import { check, EDITIONS_2018, variant } from './support/check';

const params = defaultParameters(EDITIONS_2018);
const MM = 25.4; // 1 in = 25.4 mm exactly (NIST SP 811)

function planOf(input: unknown): Plan {
  const parsed = parsePlan(input);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return parsed.plan;
}

const rects = (shapes: Shape[], role: Shape['role']) => shapes.filter((s): s is RectShape => s.kind === 'rect' && s.role === role);
const labels = (shapes: Shape[]) => shapes.flatMap((s) => (s.kind === 'dimension' ? [s.label] : []));

describe('front elevation', () => {
  const drawing = frontElevation(planOf(hallClosetPassPlan), { params });

  it('draws the demo enclosure to scale in inches', () => {
    // Demo plan: 4' 8" × 7' outside = 56 × 84 in (1 ft = 12 in, NIST SP 811); 3/4 in panels.
    const [enclosure] = rects(drawing.shapes, 'enclosure');
    expect([enclosure.width, enclosure.height]).toEqual([56, 84]);
    const panels = rects(drawing.shapes, 'panel');
    expect(panels.filter((p) => p.height === 84).map((p) => p.width)).toEqual([0.75, 0.75]);
    expect(drawing.scale).toBe('to-scale');
    expect(drawing.width).toBeGreaterThan(56);
    expect(drawing.height).toBeGreaterThan(84);
  });

  it('draws the units to scale standing on the floor, side by side with the maker’s side gap', () => {
    // Demo: two 24 × 34 in units, 1 in side clearance; one shared 1 in gap between them (as clearances.requiredWidthIn).
    const [enclosure] = rects(drawing.shapes, 'enclosure');
    const floorY = enclosure.y + enclosure.height;
    const [washer] = rects(drawing.shapes, 'washer');
    const [dryer] = rects(drawing.shapes, 'dryer');
    expect([washer.width, washer.height, dryer.width, dryer.height]).toEqual([24, 34, 24, 34]);
    expect(washer.y + washer.height).toBeCloseTo(floorY, 9);
    expect(dryer.x - (washer.x + washer.width)).toBeCloseTo(1, 9);
  });

  it('labels dimensions in the plan’s units', () => {
    // 56 in = 4' 8"; inside 56 − 2 × 3/4 = 54-1/2 in = 4' 6-1/2" (common practice, no published source).
    expect(labels(drawing.shapes)).toEqual(expect.arrayContaining([`4' 8" outside`, `7' 0" outside`, `4' 6-1/2" inside`, `2' 0"`, `2' 10"`, 'toe kick 3-1/2"']));
    const metric = frontElevation(planOf(gasWalkInBedroomPlan), { params });
    // Demo metric plan: 762 mm inside + 2 × 19 mm panels = 800 mm outside.
    expect(labels(metric.shapes)).toEqual(expect.arrayContaining(['800 mm outside', '762 mm inside', '610 mm', '850 mm']));
    const [enclosure] = rects(metric.shapes, 'enclosure');
    expect(enclosure.width * MM).toBeCloseTo(800, 6);
  });

  it('stacks the dryer on the washer', () => {
    // Demo metric plan: 850 mm washer, so the dryer's underside is 850 mm up.
    const metric = frontElevation(planOf(gasWalkInBedroomPlan), { params });
    const [washer] = rects(metric.shapes, 'washer');
    const [dryer] = rects(metric.shapes, 'dryer');
    expect((washer.y - (dryer.y + dryer.height)) * MM).toBeCloseTo(0, 6);
    expect(dryer.height * MM).toBeCloseTo(850, 6);
  });

  it('draws the maker’s clearances as zones, and marks them when the check fails them', async () => {
    // The units and side clearances need 24 + 24 + 3 × 1 = 51 in; a 51-in outside closet is 49-1/2 in inside.
    const input = variant((p) => (p.enclosure.width = 51));
    const plain = frontElevation(planOf(input), { params });
    expect(rects(plain.shapes, 'clearance').length).toBeGreaterThan(0);
    expect(rects(plain.shapes, 'clearance-fail')).toHaveLength(0);

    const evaluation = await check(input);
    const marked = frontElevation(planOf(input), { params, marks: evaluation.findings });
    const failing = rects(marked.shapes, 'clearance-fail');
    expect(failing.map((r) => r.ruleKey)).toEqual(['clearances.width', 'clearances.width', 'clearances.width', 'clearances.width']);
    // Short of the maker's clearance: a fail (installation per the listing, IRC M1307.1).
    expect(failing.every((r) => r.status === 'fail')).toBe(true);
    expect(rects(marked.shapes, 'clearance').map((r) => r.ruleKey)).toEqual(['clearances.height', 'clearances.height']);
    expect(marked.notes.some((n) => n.startsWith("Fails — Maker's side clearances"))).toBe(true);

    // A bare rule key marks the zones as failing.
    const byKey = frontElevation(planOf(input), { params, marks: ['clearances.height'] });
    expect(rects(byKey.shapes, 'clearance-fail').filter((r) => r.ruleKey === 'clearances.height').every((r) => r.status === 'fail')).toBe(true);
  });

  it('draws the toe kick and the door outlines with their hinges', () => {
    const [kick] = rects(drawing.shapes, 'toe-kick');
    expect(kick.height).toBe(3.5);
    const doors = rects(drawing.shapes, 'door');
    // Demo doors: two leaves 27-1/4 × 78 in, hung on the toe kick.
    expect(doors.map((d) => [d.width, d.height])).toEqual([[27.25, 78], [27.25, 78]]);
    expect(doors.every((d) => d.dashed)).toBe(true);
    // Two strokes per hinge mark, four hinges per door.
    expect(drawing.shapes.filter((s) => s.role === 'hinge')).toHaveLength(2 * 4 * 2);
  });
});

describe('plan view', () => {
  const plan = planOf(hallClosetPassPlan);
  const drawing = planView(plan, { params });
  const facts = computeFacts(plan, params);

  it('shows the enclosure depth and the depth left in front of the units for hinge arms', () => {
    // common practice, no published source: 36 − 3/4 back − 3/4 door = 34-1/2 inside; 34-1/2 − (24 + 2 + 4) = 4-1/2 in.
    expect(labels(drawing.shapes)).toEqual(expect.arrayContaining([`3' 0" outside`, `2' 10-1/2" inside`, '4-1/2"']));
    const gap = drawing.shapes.find((s) => s.kind === 'dimension' && s.ruleKey === 'door-hardware.hinge-arm-room');
    expect(gap && gap.kind === 'dimension' ? gap.valueIn : null).toBe(facts['doors.frontGapIn']);
    expect(gap && gap.kind === 'dimension' ? Math.abs(gap.to[1] - gap.from[1]) : null).toBeCloseTo(4.5, 9);
    const [arms] = rects(drawing.shapes, 'hinge-arm-zone');
    expect(arms.height).toBe(params.doors.hingeArmDepthIn);
  });

  it('draws the rear zone wanted behind the units', () => {
    // TRADE.md (S/CP): about 6 in behind the units for the vent elbow, hoses and cord.
    const [zone] = rects(drawing.shapes, 'rear-zone');
    expect(zone.height).toBe(6);
    expect(zone.y).toBe(0.75 + (drawing.shapes.find((s) => s.kind === 'rect' && s.role === 'panel') as RectShape).y);
  });

  it('sets the units back at the maker’s rear clearance', () => {
    // Demo: 4 in rear clearance behind 24-in-deep units.
    const [washer] = rects(drawing.shapes, 'washer');
    const [back] = rects(drawing.shapes, 'panel');
    expect(washer.y - (back.y + back.height)).toBeCloseTo(4, 9);
    expect(washer.height).toBe(24);
  });

  it('swings hinged doors through a quarter turn and leaves sliding doors on their tracks', () => {
    const arcs = drawing.shapes.filter((s) => s.kind === 'arc');
    expect(arcs.map((a) => (a.kind === 'arc' ? [a.radius, a.endDeg - a.startDeg] : null))).toEqual([[27.25, 90], [27.25, 90]]);
    const sliding = planView(planOf(longExhaustFailPlan), { params });
    expect(sliding.shapes.some((s) => s.kind === 'arc')).toBe(false);
    expect(rects(sliding.shapes, 'hinge-arm-zone')).toHaveLength(0);
  });

  it('marks a rear zone the check cautions on', async () => {
    const evaluation = await check(longExhaustFailPlan);
    const marked = planView(planOf(longExhaustFailPlan), { params, marks: evaluation.findings });
    const [zone] = rects(marked.shapes, 'rear-zone');
    expect(zone.status).toBe('caution');
  });
});

describe('shape frame', () => {
  it('moves shapes to the margin without scaling them', () => {
    const framed = frame([{ kind: 'rect', role: 'enclosure', x: -10, y: -20, width: 30, height: 40 }], 2);
    expect(framed.shapes[0]).toMatchObject({ x: 2, y: 2, width: 30, height: 40 });
    expect([framed.width, framed.height]).toEqual([34, 44]);
    expect(boundsOf(framed.shapes)).toEqual({ minX: 2, minY: 2, maxX: 32, maxY: 42 });
  });

  it('sets dimension lines off to the left of their direction', () => {
    // A left-to-right dimension with a positive offset sits above its points (y grows downward).
    const g = dimensionGeometry({ kind: 'dimension', role: 'dimension', from: [0, 10], to: [20, 10], offset: 3, valueIn: 20, label: '20"', size: 1 });
    expect([g.from, g.to]).toEqual([[0, 7], [20, 7]]);
    const down = dimensionGeometry({ kind: 'dimension', role: 'dimension', from: [5, 0], to: [5, 10], offset: 2, valueIn: 10, label: '10"', size: 1 });
    expect([down.from, down.to, down.angleDeg]).toEqual([[7, 0], [7, 10], -90]);
  });
});
