import { describe, expect, it } from 'vitest';
import { evaluate } from '@/lib/domain/engine';
import { parsePlan, type Plan } from '@/lib/domain/plan';
import { proposeDoorLeaves, proposeHinges, roundUpToMeasure, sizeEnclosure } from '@/lib/domain/sizing';
import { mmToInches } from '@/lib/domain/units';
import { buildRuleSet, type RuleSetOverrides } from '@/rules';
import { EDITIONS_2018, variant, type LoosePlan } from './support/check';

/*
 * Hand-worked on the demo hall-closet plan: a side-by-side pair, each 24 in wide, 24 in deep with 2 in of knobs
 * and door, 34 in high; the maker's clearances 1 in at the sides, top and front and 4 in behind (the plan's own
 * figures, typical per TRADE.md "maker's closet clearances", manufacturer's instructions, S); 3/4 in panels and doors.
 */
const ruleSet = (overrides?: RuleSetOverrides) => ({ id: undefined, jurisdiction: 'Testville', version: 1, ...buildRuleSet(EDITIONS_2018, overrides) });

function plan(mutate: (p: LoosePlan) => void = () => {}): Plan {
  const parsed = parsePlan(variant(mutate));
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return parsed.plan;
}

const SIZE_RULES_FAIL: RuleSetOverrides = {
  rules: { 'clearances.width': { severity: 'fail' }, 'clearances.depth': { severity: 'fail' }, 'clearances.height': { severity: 'fail' } },
};

describe('smallest enclosure', () => {
  it('works out the inside and outside sizes every rule asks for, and what the plan leaves to spare', async () => {
    const sizing = await sizeEnclosure(ruleSet(), plan());
    // Width: 24 + 24 + 1 + 1 + one shared 1 in gap = 51 in (maker's side clearances; the shared gap counted once).
    // Depth: 24 + 2 + 1 in in front = 27 in, plus a 6 in rear zone = 33 in (rear zone 6 in: trade references,
    // common practice, TRADE.md); deeper than 24 + 2 + 1 + 4 = 31 in (maker) and 24 + 2 + 4 + 2 in hinge-arm room
    // = 32 in (hinge arm 2 in: common practice, no published source).
    // Height: 34 + 1 = 35 in.
    expect(sizing.comfortableInside).toEqual({ width: 51, depth: 33, height: 35 });
    // Outside: two side panels, the back panel and the 3/4 in doors, one top panel.
    expect(sizing.comfortableOutside).toEqual({ width: 52.5, depth: 34.5, height: 35.75 });
    // The plan: 4' 8" = 56 in outside → 54.5 in inside; 36 → 34.5 in; 7 ft = 84 → 83.25 in.
    expect(sizing.currentInside).toEqual({ width: 54.5, depth: 34.5, height: 83.25 });
    expect(sizing.spareComfortable).toEqual({ width: 3.5, depth: 1.5, height: 48.25 });
  });

  it('the maker\'s clearances bound the fail-severity size (installed per the listing, IRC 2018 M1307.1)', async () => {
    const sizing = await sizeEnclosure(ruleSet(), plan());
    // 24 + 24 + 1 + 1 + 1 = 51 wide, 24 + 2 + 1 + 4 = 31 deep, 34 + 1 = 35 high (plan figures, maker's clearances).
    expect(sizing.smallestInside).toEqual({ width: 51, depth: 31, height: 35 });
    expect(sizing.spare).toEqual({ width: 3.5, depth: 3.5, height: 48.25 });
  });

  it('with every size rule a caution, only the units themselves bound the fail-severity size', async () => {
    const cautions: RuleSetOverrides = {
      rules: { 'clearances.width': { severity: 'caution' }, 'clearances.depth': { severity: 'caution' }, 'clearances.height': { severity: 'caution' } },
    };
    const sizing = await sizeEnclosure(ruleSet(cautions), plan());
    // The units alone: 24 + 24 wide, 24 + 2 deep, 34 high (plan figures).
    expect(sizing.smallestInside).toEqual({ width: 48, depth: 26, height: 34 });
    expect(sizing.spare).toEqual({ width: 6.5, depth: 8.5, height: 49.25 });
  });

  it('follows the rule set: a rule an AHJ makes fail-severity joins the smallest size', async () => {
    const sizing = await sizeEnclosure(ruleSet(SIZE_RULES_FAIL), plan());
    // clearances.depth asks 24 + 2 + 1 + 4 = 31 in inside (maker's figures); the rear zone stays a caution.
    expect(sizing.smallestInside).toEqual({ width: 51, depth: 31, height: 35 });
    expect(sizing.smallestOutside).toEqual({ width: 52.5, depth: 32.5, height: 35.75 });
  });

  it('stacked units add their heights and take the wider unit', async () => {
    const sizing = await sizeEnclosure(ruleSet(SIZE_RULES_FAIL), plan((p) => (p.arrangement = 'stacked')));
    // 34 + 34 + 1 in top clearance above the dryer = 69 in; 24 + 2 × 1 in = 26 in wide (plan figures).
    expect(sizing.smallestInside.height).toBe(69);
    expect(sizing.smallestInside.width).toBe(26);
  });

  it('gives sizes before the enclosure is entered, and none of its own', async () => {
    const sizing = await sizeEnclosure(ruleSet(), plan((p) => { delete p.enclosure.width; delete p.enclosure.depth; delete p.enclosure.height; }));
    expect(sizing.comfortableInside).toEqual({ width: 51, depth: 33, height: 35 });
    expect(sizing.currentInside).toEqual({ width: null, depth: null, height: null });
    expect(sizing.spare.depth).toBeNull();
  });

  it('rounds a metric plan up to the next whole millimetre', async () => {
    // 1 in = 25.4 mm exactly (NIST SP 811): a 27 in wide unit is 685.8 mm; its size is rounded up, not down.
    expect(roundUpToMeasure(mmToInches(685.8), 'metric')).toBeCloseTo(mmToInches(686), 9);
    expect(roundUpToMeasure(30.01, 'imperial')).toBe(30.0625);
  });

  it('agrees with the engine: the comfortable size passes every size rule and 1/16 in less fails one', async () => {
    const set = ruleSet();
    const sizing = await sizeEnclosure(set, plan());
    const at = (depth: number) =>
      plan((p) => {
        p.enclosure.depthMeasured = 'inside';
        p.enclosure.width = sizing.comfortableInside.width;
        p.enclosure.height = sizing.comfortableInside.height;
        p.enclosure.depth = depth;
      });
    const ok = await evaluate(set, at(sizing.comfortableInside.depth!));
    expect(ok.findings.filter((f) => f.status === 'caution' || f.status === 'fail').map((f) => f.ruleKey)).not.toContain('clearances.rear-zone');
    const short = await evaluate(set, at(sizing.comfortableInside.depth! - 1 / 16));
    expect(short.findings.find((f) => f.ruleKey === 'clearances.rear-zone')?.status).toBe('caution');
  });
});

describe('door leaves and hinges', () => {
  const params = buildRuleSet(EDITIONS_2018).parameters;

  it('shares the opening between the leaves after the reveals', () => {
    // 54.5 in opening, two leaves, 1/8 in between and at each edge (common practice, no published source):
    // (54.5 − 3 × 1/8) / 2 = 27.0625 in each.
    const proposal = proposeDoorLeaves({ openingWidthIn: 54.5, leaves: 2, revealBetweenIn: 0.125, revealEdgeIn: 0.125, leafHeightIn: 78, units: 'imperial' }, params);
    expect(proposal.ok && proposal.leafWidthIn).toBe(27.0625);
    expect(proposal.ok && proposal.leaves).toHaveLength(2);
  });

  it('rounds a leaf down so the reveals are never smaller than asked', () => {
    // 36 in, three leaves, 1/8 in reveals: (36 − 0.5) / 3 = 11.8333 in → 11-13/16 in (11.8125).
    const proposal = proposeDoorLeaves({ openingWidthIn: 36, leaves: 3, revealBetweenIn: 0.125, revealEdgeIn: 0.125, leafHeightIn: 30, units: 'imperial' }, params);
    expect(proposal.ok && proposal.leafWidthIn).toBe(11.8125);
  });

  it('counts hinges from the makers’ chart and puts the end hinges inside the edge window', () => {
    // A 78 in leaf is 1981.2 mm: up to 2000 mm takes 4 hinges (hinge makers' charts, TRADE.md, S).
    // End hinges at 80 mm, the middle of the makers' 60–100 mm window; the others evenly between.
    const hinges = proposeHinges(78, params)!;
    expect(hinges).toHaveLength(4);
    expect(hinges[0]).toBeCloseTo(mmToInches(80), 9);
    expect(78 - hinges[3]).toBeCloseTo(mmToInches(80), 9);
    expect(hinges[2] - hinges[1]).toBeCloseTo(hinges[1] - hinges[0], 9);
    // 900 mm (35.43 in) is under 1000 mm: 2 hinges.
    expect(proposeHinges(mmToInches(900), params)).toHaveLength(2);
  });

  it('refuses what cannot be built', () => {
    expect(proposeDoorLeaves({ openingWidthIn: 1, leaves: 4, revealBetweenIn: 0.5, revealEdgeIn: 0.5, leafHeightIn: 30, units: 'imperial' }, params)).toMatchObject({ ok: false });
    expect(proposeDoorLeaves({ openingWidthIn: 30, leaves: 0, revealBetweenIn: 0, revealEdgeIn: 0, leafHeightIn: 30, units: 'imperial' }, params)).toMatchObject({ ok: false });
    expect(proposeHinges(5, params)).toBeNull();
  });
});
