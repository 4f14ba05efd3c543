import { describe, expect, it } from 'vitest';
import { hingeLayouts, closetLayout, type Shape } from '@/lib/domain/drawing';
import { computeFacts } from '@/lib/domain/facts';
import { doorDetails, DOOR_DETAIL_DEFAULTS } from '@/lib/domain/facts/door-details';
import { defaultParameters } from '@/lib/domain/params';
import { parsePlan, type Plan } from '@/lib/domain/plan';
import { EDITIONS_2018, findingFor, variant } from './support/check';

const params = defaultParameters(EDITIONS_2018);
const MM = 25.4; // 1 in = 25.4 mm exactly (NIST SP 811)

function planOf(input: unknown): Plan {
  const parsed = parsePlan(input);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return parsed.plan;
}

const labels = (shapes: Shape[]) => shapes.flatMap((s) => (s.kind === 'dimension' ? [s.label] : []));

describe('door details: hinge cup boring distance', () => {
  it('defaults to 5 mm and says so: cup centre 5 + 35/2 = 22.5 mm from the hinge edge', () => {
    // 35 mm cup: hinge makers' literature (TRADE.md, V). 5 mm: common practice, no published source (makers allow 3–8 mm).
    const [door] = hingeLayouts(planOf(variant()), { params });
    expect(door.cupCentreFromDoorEdgeIn * MM).toBeCloseTo(22.5, 9);
    expect(door.notes.join(' ')).toContain('cup boring distance 5 mm (not in the plan: common practice, no published source)');
    expect(DOOR_DETAIL_DEFAULTS.cupBoringDistanceMm.source).toMatch(/common practice, no published source/);
  });

  it("uses the plan's boring distance on the overview and the drilling template", () => {
    // 4 mm boring + 17.5 mm (half the 35 mm cup, hinge makers' literature) = 21.5 mm.
    const [door] = hingeLayouts(planOf(variant((p) => (p.doors[0].cupBoringDistance = '4 mm'))), { params });
    expect(door.cupBoringDistanceIn * MM).toBeCloseTo(4, 9);
    expect(door.cupCentreFromDoorEdgeIn * MM).toBeCloseTo(21.5, 9);
    expect(labels(door.template.shapes)).toContain('boring 4 mm');
    expect(door.notes.join(' ')).toContain("cup boring distance 4 mm (the plan's)");
  });

  it('notes a boring distance outside the makers’ 3–8 mm', () => {
    // Hinge makers' literature (TRADE.md "concealed hinges"): boring distance 3–8 mm; 10 mm is outside.
    const [door] = hingeLayouts(planOf(variant((p) => (p.doors[0].cupBoringDistance = '10 mm'))), { params });
    expect(door.notes.some((n) => n.includes('outside the 3–8 mm'))).toBe(true);
    expect(doorDetails({ cupBoringDistance: 8 / MM }).boringOutsideRange).toBe(false);
    expect(doorDetails({ cupBoringDistance: 2.9 / MM }).boringOutsideRange).toBe(true);
  });
});

describe('door details: the gap under the door and the hinge side', () => {
  it('raises the door by its gap, and the plates with it', () => {
    // common practice, no published source (layout geometry): opening 84 − 3/4 = 83-1/4 in high; toe kick 3-1/2 in;
    // with a 1/2 in gap the door's bottom edge is at 4 in, so the top hinge (75 in up the door) is 83.25 − 79 = 4.25 in below the opening top.
    const [door] = hingeLayouts(planOf(variant((p) => (p.doors[0].gapBelow = 0.5))), { params });
    expect(door.positions[0].plateFromOpeningTopIn).toBe(83.25 - (3.5 + 0.5 + 75));
    expect(door.notes.join(' ')).toContain("(the plan's gap under the door)");
    const layout = closetLayout(planOf(variant((p) => (p.doors[0].gapBelow = 0.5))));
    expect(layout.doors[0].bottom).toBe(4);
    expect(layout.doors[1].bottom).toBe(3.5);
  });

  it("takes the plan's hinge side instead of the assumed one", () => {
    const assumed = closetLayout(planOf(variant()));
    expect(assumed.doors.map((d) => d.hingeSide)).toEqual(['left', 'right']);
    expect(assumed.notes.some((n) => n.startsWith('Hinge sides not in the plan are assumed'))).toBe(true);
    const given = closetLayout(planOf(variant((p) => p.doors.forEach((d: { hingeSide?: string }) => (d.hingeSide = 'right')))));
    expect(given.doors.map((d) => [d.hingeSide, d.mountsOn])).toEqual([['right', 'none'], ['right', 'right-panel']]);
    expect(given.notes.some((n) => n.startsWith('Hinge sides not in the plan'))).toBe(false);
    const [left] = hingeLayouts(planOf(variant((p) => p.doors.forEach((d: { hingeSide?: string }) => (d.hingeSide = 'right')))), { params });
    expect(left.hingeSide).toBe('right');
  });
});

describe('door details: overlay or inset, and the hinge-arm room', () => {
  // Demo plan measured inside: 36 in deep to the panels' front edges; doors 3/4 in thick.
  const inside = (mounting?: 'overlay' | 'inset') =>
    variant((p) => {
      p.enclosure.depthMeasured = 'inside';
      if (mounting) p.doors.forEach((d: { mounting?: string }) => (d.mounting = mounting));
    });

  it('an inset door closes inside a depth measured inside, by its own thickness', () => {
    // common practice, no published source: the inset leaf's back face is 3/4 in further in than an overlay leaf's.
    const overlay = computeFacts(planOf(inside('overlay')), params);
    const inset = computeFacts(planOf(inside('inset')), params);
    expect(overlay['clearances.insideDepthIn']).toBe(36);
    expect(inset['clearances.insideDepthIn']).toBe(36 - 0.75);
    expect((overlay['doors.frontGapIn'] as number) - (inset['doors.frontGapIn'] as number)).toBeCloseTo(0.75, 12);
    // Overlay is what a plan without the detail gets.
    expect(computeFacts(planOf(inside()), params)['doors.frontGapIn']).toBe(overlay['doors.frontGapIn']);
  });

  it('an outside depth already counts the door, overlay or inset', () => {
    // common practice, no published source: outside depth = back panel + clear depth + door, wherever the door closes.
    const overlay = computeFacts(planOf(variant()), params);
    const inset = computeFacts(planOf(variant((p) => p.doors.forEach((d: { mounting?: string }) => (d.mounting = 'inset')))), params);
    expect(inset['doors.frontGapIn']).toBe(overlay['doors.frontGapIn']);
  });

  it('turns the hinge-arm finding when an inset door takes the last of the room', async () => {
    // Rule parameter hingeArmDepthIn = 2 in (lib/domain/params/defaults.ts; common practice, no published source).
    // Pick the depth so the overlay leaves exactly 2.5 in: inset doors then leave 2.5 − 0.75 = 1.75 in, under 2 in.
    const base = computeFacts(planOf(inside('overlay')), params)['doors.frontGapIn'] as number;
    const depth = 36 - (base - 2.5);
    const at = (mounting: 'overlay' | 'inset') => variant((p) => {
      p.enclosure.depthMeasured = 'inside';
      p.enclosure.depth = depth;
      p.doors.forEach((d: { mounting?: string }) => (d.mounting = mounting));
    });
    expect((await findingFor('door-hardware.hinge-arm-room', at('overlay'))).status).toBe('pass');
    const inset = await findingFor('door-hardware.hinge-arm-room', at('inset'));
    expect(inset.status).not.toBe('pass');
    expect(inset.measured).toBeCloseTo(1.75, 9);
  });

  it('notes an inset door on the hinge layout and its template', () => {
    const [door] = hingeLayouts(planOf(inside('inset')), { params });
    expect(door.mounting).toBe('inset');
    expect(door.notes.some((n) => n.includes('is inset'))).toBe(true);
    const templateText = door.template.shapes.flatMap((s) => (s.kind === 'text' ? [s.text] : [])).join(' ');
    expect(templateText).toContain('inset');
  });
});
