import fc from 'fast-check';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { DrawingFigure } from '@/components/drawings/drawing-figure';
import { boundsOf, exhaustSchematic, frontElevation, hingeLayouts, planView, type Drawing } from '@/lib/domain/drawing';
import { defaultParameters } from '@/lib/domain/params';
import { parsePlan, type Plan } from '@/lib/domain/plan';
import { demoPlans, hallClosetPassPlan } from '@/tests/fixtures/plans';
import { EDITIONS_2018, type LoosePlan } from './support/check';

const params = defaultParameters(EDITIONS_2018);

function planOf(input: unknown): Plan {
  const parsed = parsePlan(input);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return parsed.plan;
}

function allDrawings(plan: Plan): Drawing[] {
  const options = { params, marks: ['clearances.width', 'clearances.rear-zone', 'door-hardware.hinge-positions', 'exhaust.developed-length'] };
  return [
    frontElevation(plan, options),
    planView(plan, options),
    exhaustSchematic(plan, options),
    ...hingeLayouts(plan, options).flatMap((l) => [l.overview, l.template]),
  ];
}

function expectSound(drawing: Drawing): void {
  expect(Number.isFinite(drawing.width) && drawing.width > 0).toBe(true);
  expect(Number.isFinite(drawing.height) && drawing.height > 0).toBe(true);
  // Every number in every shape is real (no NaN or Infinity from a missing size)...
  const numbers = JSON.stringify(drawing.shapes, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? `bad:${v}` : v));
  expect(numbers).not.toContain('bad:');
  expect(numbers).not.toContain('null');
  // ...and everything lies inside the frame.
  const box = boundsOf(drawing.shapes);
  expect(box).not.toBeNull();
  expect(box!.maxX).toBeLessThanOrEqual(drawing.width + 1e-6);
  expect(box!.maxY).toBeLessThanOrEqual(drawing.height + 1e-6);
  expect(drawing.caution).toContain('AHJ');
}

describe('drawings with missing plan data', () => {
  it('an empty plan still draws and lists what is missing', () => {
    const plan = planOf({ units: 'imperial' });
    const elevation = frontElevation(plan, { params });
    expect(elevation.missing).toEqual(expect.arrayContaining(['enclosure.width', 'enclosure.height', 'washer.width', 'dryer.height', 'arrangement']));
    expect(elevation.missing).not.toContain('enclosure.depth');
    expect(planView(plan, { params }).missing).toEqual(expect.arrayContaining(['enclosure.depth', 'washer.depth', 'dryer.frontProjection']));
    const exhaust = exhaustSchematic(plan, { params });
    expect(exhaust.missing).toEqual(['exhaust.run', 'exhaust.transition.length']);
    expect(exhaust.developedLengthIn).toBeNull();
    // IRC 2018 M1502.4.5.1: the 35 ft limit is still drawn.
    expect(exhaust.allowedLengthIn).toBe(35 * 12);
    expect(hingeLayouts(plan, { params })).toEqual([]);
    allDrawings(plan).forEach(expectSound);
  });

  it('draws the units without an enclosure', () => {
    const input = structuredClone(hallClosetPassPlan) as LoosePlan;
    delete input.enclosure;
    const drawing = frontElevation(planOf(input), { params });
    expect(drawing.shapes.filter((s) => s.role === 'washer' || s.role === 'dryer')).toHaveLength(2);
    expect(drawing.shapes.some((s) => s.role === 'enclosure')).toBe(false);
    expect(drawing.missing).toContain('enclosure.width');
  });

  it('a hinged door without a height keeps its positions from the bottom and lists the height', () => {
    const input = structuredClone(hallClosetPassPlan) as LoosePlan;
    delete input.doors[0].height;
    const [door] = hingeLayouts(planOf(input), { params });
    expect(door.missing).toContain('doors.0.height');
    expect(door.positions.map((p) => p.fromDoorTopIn)).toEqual([null, null, null, null]);
    // Plates still place from the opening: they depend on where the door hangs, not on its height.
    expect(door.positions[0].plateFromOpeningTopIn).toBe(83.25 - (3.5 + 75));
    expectSound(door.overview);
  });

  it('the figure renders a missing list rather than failing', () => {
    const html = renderToStaticMarkup(createElement(DrawingFigure, { drawing: frontElevation(planOf({ units: 'metric' }), { params }), id: 'f' }));
    expect(html).toContain('data-testid="drawing-missing"');
    expect(html).toContain('Enclosure width');
  });

  it('never throws, whatever part of a demo plan is left out', () => {
    const paths = demoPlans.flatMap(({ plan }) => leafPaths(plan)).filter((p, i, all) => all.indexOf(p) === i && p !== 'units');
    fc.assert(
      fc.property(fc.constantFrom(...demoPlans.map((d) => d.plan)), fc.subarray(paths, { maxLength: 12 }), (base, dropped) => {
        const input = structuredClone(base) as LoosePlan;
        for (const path of dropped) remove(input, path.split('.'));
        const parsed = parsePlan(input);
        if (!parsed.ok) return; // e.g. a run item left with neither a straight nor an elbow
        allDrawings(parsed.plan).forEach(expectSound);
      }),
      { numRuns: 150 },
    );
  });
});

function leafPaths(value: unknown, prefix = ''): string[] {
  if (value === null || typeof value !== 'object') return [prefix];
  return [prefix, ...Object.entries(value).flatMap(([k, v]) => leafPaths(v, prefix ? `${prefix}.${k}` : k))].filter(Boolean);
}

function remove(target: LoosePlan, path: string[]): void {
  let node = target;
  for (const key of path.slice(0, -1)) {
    if (node === null || typeof node !== 'object' || !(key in node)) return;
    node = node[key];
  }
  if (node !== null && typeof node === 'object') {
    if (Array.isArray(node)) node.splice(Number(path.at(-1)), 1);
    else delete node[path.at(-1)!];
  }
}
