import { describe, expect, it } from 'vitest';
import { computeFacts, hingesRequired, nominalSizeIn } from '@/lib/domain/facts';
import { defaultParameters } from '@/lib/domain/params';
import { parsePlan } from '@/lib/domain/plan';
import { EDITIONS_2018, findingFor, variant } from './support/check';

const params = defaultParameters(EDITIONS_2018);
function factsOf(input: unknown) {
  const parsed = parsePlan(input);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return computeFacts(parsed.plan, params);
}

describe('enclosure geometry', () => {
  it('inside sizes from outside sizes less panels and doors', () => {
    // common practice, no published source: 56 - 2 × 3/4 = 54-1/2; 36 - 3/4 back - 3/4 door = 34-1/2; 84 - 3/4 top.
    const facts = factsOf(variant());
    expect(facts['clearances.insideWidthIn']).toBe(54.5);
    expect(facts['clearances.insideDepthIn']).toBe(34.5);
    expect(facts['clearances.insideHeightIn']).toBe(83.25);
  });

  it('inside sizes are taken as given when measured inside', () => {
    const facts = factsOf(variant((p) => (p.enclosure.depthMeasured = 'inside')));
    expect(facts['clearances.insideWidthIn']).toBe(56);
    expect(facts['clearances.insideDepthIn']).toBe(36);
  });

  it('trade rule of thumb: 24-in-deep units want about 30 in of depth', () => {
    // TRADE.md (S/CP): 24 in unit + ~6 in rear zone ≈ 30 in; with 2 in knobs and 1 in front gap that is 33 in inside.
    const facts = factsOf(variant((p) => Object.assign(p.enclosure, { depthMeasured: 'inside', depth: 33 })));
    expect(facts['clearances.rearZoneIn']).toBe(6);
  });

  it('stacked units need the sum of heights plus the top unit’s clearance', () => {
    // Manufacturer's instructions (plan's figures): 34 + 34 + 1 = 69 in.
    const facts = factsOf(variant((p) => (p.arrangement = 'stacked')));
    expect(facts['clearances.requiredHeightIn']).toBe(69);
    expect(facts['clearances.requiredWidthIn']).toBe(26);
  });

  it('removal path: widest unit plus 1 in', async () => {
    // common practice, no published source: opening ≥ unit width + ~1 in.
    const f = await findingFor('service.removal-width', variant((p) => (p.enclosure.openingWidth = 24.5)));
    expect(f.status).toBe('caution');
    expect(f.remedy).toBe(`Widen the clear opening by 1/2".`);
  });
});

describe('door hardware', () => {
  it('hinge count by door height follows the makers’ chart', () => {
    // Hinge makers' charts (TRADE.md S): 2 up to 1000 mm, 3 up to 1500, 4 up to 2000, 5 up to 2500.
    const mm = (x: number) => x / 25.4; // NIST SP 811: 1 in = 25.4 mm
    expect(hingesRequired(mm(900), params)).toBe(2);
    expect(hingesRequired(mm(1000), params)).toBe(2);
    expect(hingesRequired(mm(1001), params)).toBe(3);
    expect(hingesRequired(mm(2000), params)).toBe(4);
    expect(hingesRequired(mm(2400), params)).toBe(5);
    expect(hingesRequired(mm(2600), params)).toBe(6); // past the chart: one more per 500 mm, common practice
  });

  it('an 80-in door on three hinges cautions, with a remedy', async () => {
    // 80 in = 2032 mm (NIST SP 811) → 5 hinges by the makers' chart.
    const f = await findingFor('door-hardware.hinge-count', variant((p) => (p.doors[1] = { kind: 'hinged', width: 27, height: 80, thickness: 0.75, hinges: [3, 40, 77] })));
    expect(f.status).toBe('caution');
    expect([f.measured, f.limit]).toEqual([3, 5]);
    expect(f.remedy).toBe('Add 2 hinges to the tallest door, spaced evenly between the end hinges.');
  });

  it('front gap for hinge arms: inside depth less unit depth, knobs and rear clearance', () => {
    // common practice, no published source: 34-1/2 - (24 + 2 + 4) = 4-1/2 in.
    expect(factsOf(variant())['doors.frontGapIn']).toBe(4.5);
  });

  it('bypass sliding doors leave one leaf’s width clear; hinged leaves their thickness', () => {
    // common practice, no published source (geometry defined in lib/facts/door-hardware.ts).
    const sliding = factsOf(variant((p) => p.doors.forEach((d: { kind: string }) => (d.kind = 'sliding'))));
    expect(sliding['doors.clearOpeningWithDoorsOpenIn']).toBe(54.5 - 27.25);
    expect(sliding['doors.applianceDoorSpanIn']).toBe(24);
    const hinged = factsOf(variant());
    expect(hinged['doors.clearOpeningWithDoorsOpenIn']).toBe(53);
    expect(hinged['doors.applianceDoorSpanIn']).toBe(48);
  });
});

describe('other facts', () => {
  it('snaps metric pipe and duct sizes to nominal inches', () => {
    // DN 50 = 2 in and 100 mm = 4 in nominal (trade usage; 1 in = 25.4 mm, NIST SP 811).
    expect(nominalSizeIn(50 / 25.4)).toBe(2);
    expect(nominalSizeIn(100 / 25.4)).toBe(4);
    expect(nominalSizeIn(3)).toBe(3);
    expect(nominalSizeIn(3.5)).toBe(3.5);
  });

  it('gas location is restricted for a closet opening into a bedroom', () => {
    // IRC G2406.2 / IFGC 303.3 (TRADE.md S).
    expect(factsOf(variant((p) => (p.space.opensInto = 'bedroom')))['gas.restrictedSpace']).toBe(true);
    expect(factsOf(variant((p) => (p.space.kind = 'storage-closet')))['gas.restrictedSpace']).toBe(true);
    expect(factsOf(variant())['gas.restrictedSpace']).toBe(false);
  });

  it('receptacle move remedy in feet and inches', async () => {
    // NEC 210.50(C): within 6 ft; 8 ft 6 in away → move 2 ft 6 in.
    const f = await findingFor('electrical.washer-receptacle-reach', variant((p) => (p.electrical.receptacles[0].distanceToAppliance = `8' 6"`)));
    expect(f.remedy).toBe(`Move the receptacle 2' 6" closer to the appliance.`);
  });

  it('opening remedy in square inches', async () => {
    // IMC 2018 504.6: 100 sq in.
    const f = await findingFor('makeup-air.closet-opening', variant((p) => (p.makeupAir.openings = [{ position: 'bottom', netFreeArea: 64 }])));
    expect(f.remedy).toMatch(/^Add 36 sq in of net free opening area/);
  });
});
