import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { DrawingSvg } from '@/components/drawings/drawing-svg';
import { CUP_DIAMETER_MM, hingeLayouts, PLATE_SETBACK_MM, TEMPLATE_SHEET_IN, type Shape } from '@/lib/domain/drawing';
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

function circles(shapes: Shape[], role: Shape['role']) {
  return shapes.flatMap((s) => (s.kind === 'circle' && s.role === role ? [s] : []));
}

describe('hinge positions', () => {
  it('are measured from the top: door height less the position from the bottom', () => {
    // Demo door: 78 in tall, hinges 3, 27, 51 and 75 in from the bottom → 3, 27, 51, 75 in from the top, top hinge first.
    const [left, right] = hingeLayouts(planOf(hallClosetPassPlan), { params });
    expect(left.positions.map((p) => p.fromDoorTopIn)).toEqual([78 - 75, 78 - 51, 78 - 27, 78 - 3]);
    expect(left.positions.map((p) => p.fromDoorBottomIn)).toEqual([75, 51, 27, 3]);
    expect([left.hingeSide, left.mountsOn, right.hingeSide, right.mountsOn]).toEqual(['left', 'left-panel', 'right', 'right-panel']);
  });

  it('works in millimetres too', () => {
    // Demo door 2032 mm, top hinge 1952 mm from the bottom → 80 mm from the top (1 in = 25.4 mm, NIST SP 811).
    const [door] = hingeLayouts(planOf(gasWalkInBedroomPlan), { params });
    expect(door.positions[0].fromDoorTopIn! * MM).toBeCloseTo(80, 6);
    expect(door.positions.at(-1)!.fromDoorTopIn! * MM).toBeCloseTo(2032 - 80, 6);
  });

  it('places the plates from the top of the opening and the top of the side panel', () => {
    // common practice, no published source (geometry stated in lib/domain/drawing/layout.ts): the door hangs on the toe kick.
    // Demo: 84 in outside, 3/4 in top panel → opening 83-1/4 in high; door bottom at 3-1/2 in; top hinge 75 in up.
    const [door] = hingeLayouts(planOf(hallClosetPassPlan), { params });
    expect(door.positions[0].plateFromOpeningTopIn).toBe(83.25 - (3.5 + 75));
    expect(door.positions[0].plateFromPanelTopIn).toBe(84 - (3.5 + 75));
    expect(door.plateSetbackIn * MM).toBeCloseTo(PLATE_SETBACK_MM, 9);
    expect(door.notes.some((n) => n.includes('common practice'))).toBe(true);
  });

  it('flags a door short of hinges against the makers’ chart', () => {
    // Hinge makers' charts (TRADE.md, S): up to 2000 mm four hinges; 78 in = 1981.2 mm (NIST SP 811).
    const [door] = hingeLayouts(planOf(variant((p) => (p.doors[0].hinges = [3, 75]))), { params });
    expect(door.notes).toContain('Door 1 has 2 hinges; the hinge makers\' chart asks for 4 at its height.');
  });

  it('marks end hinges outside the makers’ 60–100 mm band when the check flags them', async () => {
    // Makers' guidance (TRADE.md, S): cup centre 60–100 mm from the door ends. 3 in = 76.2 mm passes; 6 in = 152.4 mm does not.
    const input = variant((p) => (p.doors[0].hinges = [6, 27, 51, 75]));
    const evaluation = await check(input);
    const [door] = hingeLayouts(planOf(input), { params, marks: evaluation.findings });
    const flagged = circles(door.overview.shapes, 'cup').filter((c) => c.status);
    expect(flagged).toHaveLength(1);
    expect(flagged[0].status).toBe('caution');
  });

  it('leaves bifold and sliding doors out', () => {
    expect(hingeLayouts(planOf(longExhaustFailPlan), { params })).toEqual([]);
  });
});

describe('drilling template', () => {
  const [door] = hingeLayouts(planOf(hallClosetPassPlan), { params });
  const template = door.template;

  it('is a full-size sheet that fits Letter and A4', () => {
    // ISO 216: A4 210 × 297 mm; ANSI Letter 8.5 × 11 in; half-inch margins each side.
    expect(template.scale).toBe('full-size');
    expect([template.width, template.height]).toEqual([TEMPLATE_SHEET_IN.width, TEMPLATE_SHEET_IN.height]);
    expect(template.width + 1).toBeLessThanOrEqual(Math.min(8.5, 210 / MM));
    expect(template.height + 1).toBeLessThanOrEqual(Math.min(11, 297 / MM));
  });

  it('renders at 1:1: SVG size in inches equal to its viewBox', () => {
    // 1 in = 25.4 mm (NIST SP 811): one user unit prints as 25.4 mm.
    const svg = renderToStaticMarkup(createElement(DrawingSvg, { drawing: template, id: 't' }));
    expect(svg).toContain(`width="${TEMPLATE_SHEET_IN.width}in"`);
    expect(svg).toContain(`height="${TEMPLATE_SHEET_IN.height}in"`);
    expect(svg).toContain(`viewBox="0 0 ${TEMPLATE_SHEET_IN.width} ${TEMPLATE_SHEET_IN.height}"`);
  });

  it('carries a 100 mm scale check bar', () => {
    // 100 mm / 25.4 mm per in (NIST SP 811) = 3.937 in.
    const bar = template.shapes.find((s) => s.kind === 'rect' && s.role === 'scale-bar-outline');
    expect(bar && bar.kind === 'rect' ? bar.width * MM : null).toBeCloseTo(100, 9);
    expect(template.shapes.some((s) => s.kind === 'dimension' && s.label === 'this bar must measure 100 mm')).toBe(true);
  });

  it('shows the 35 mm cup at the boring distance from the door edge', () => {
    // Hinge makers' literature (TRADE.md, V): 35 mm cup; boring distance 5 mm (3–8 mm allowed) → centre 22.5 mm in.
    const [cup] = circles(template.shapes, 'cup');
    expect(cup.radius * 2 * MM).toBeCloseTo(CUP_DIAMETER_MM, 9);
    const edgeToCentre = template.shapes.find((s) => s.kind === 'dimension' && s.label.endsWith('to cup centre'));
    expect(edgeToCentre && edgeToCentre.kind === 'dimension' ? edgeToCentre.valueIn * MM : null).toBeCloseTo(22.5, 9);
    expect(door.cupCentreFromDoorEdgeIn * MM).toBeCloseTo(22.5, 9);
  });

  it('puts the plate holes 32 mm apart on the 37 mm line, mirrored for a right-hand door', () => {
    // common practice, no published source: two-hole plate, holes 32 mm apart, centre line 37 mm from the front edge.
    const [, right] = hingeLayouts(planOf(hallClosetPassPlan), { params });
    for (const layout of [door, right]) {
      const holes = circles(layout.template.shapes, 'hole');
      expect(holes).toHaveLength(2);
      expect(Math.abs(holes[1].centre[1] - holes[0].centre[1]) * MM).toBeCloseTo(32, 9);
      const setback = layout.template.shapes.find((s) => s.kind === 'dimension' && s.label.endsWith('to plate centre'));
      expect(setback && setback.kind === 'dimension' ? Math.abs(setback.to[0] - setback.from[0]) * MM : null).toBeCloseTo(37, 9);
      expect(holes[0].centre[0]).toBeCloseTo(setback && setback.kind === 'dimension' ? setback.to[0] : NaN, 9);
    }
    // Mirrored: the left door's cup sits left of the sheet's centre line, the right door's to the right.
    const cupX = (l: typeof door) => circles(l.template.shapes, 'cup')[0].centre[0];
    expect(cupX(door)).toBeLessThan(TEMPLATE_SHEET_IN.width / 2);
    expect(cupX(right)).toBeGreaterThan(TEMPLATE_SHEET_IN.width / 2);
    expect(cupX(door) + cupX(right)).toBeCloseTo(TEMPLATE_SHEET_IN.width, 9);
  });

  it('lists every hinge from the top in the plan’s units with millimetres beside', () => {
    const texts = template.shapes.flatMap((s) => (s.kind === 'text' ? [s.text] : []));
    // 3 in = 76.2 mm; 4-3/4 in = 120.65 mm, shown to 0.1 mm (NIST SP 811).
    expect(texts).toContain('3" (76.2 mm)');
    expect(texts).toContain('4-3/4" (120.7 mm)');
    expect(texts.some((t) => t.includes('AHJ'))).toBe(true);
  });
});
