import { describe, expect, it } from 'vitest';
import { evaluate } from '@/lib/domain/engine';
import { parsePlan, type Plan } from '@/lib/domain/plan';
import { planFixes, type LengthFix, type PlanFix } from '@/lib/domain/remedies/plan-fixes';
import { buildRuleSet } from '@/rules';
import { EDITIONS_2018, variant, type LoosePlan } from './support/check';

const set = { jurisdiction: 'Testville', version: 1, ...buildRuleSet(EDITIONS_2018) };

function plan(mutate: (p: LoosePlan) => void): Plan {
  const parsed = parsePlan(variant(mutate));
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return parsed.plan;
}

function withValue(p: Plan, path: string, value: number): Plan {
  const copy: any = structuredClone(p);
  const keys = path.split('.');
  let o = copy;
  for (const k of keys.slice(0, -1)) o = o[k];
  o[keys[keys.length - 1]] = value;
  return copy;
}

/** The plan after a fix, as the editor's apply action changes it. */
function applied(p: Plan, fix: PlanFix): Plan {
  if (fix.kind === 'length') return withValue(p, fix.path, fix.toIn);
  if (fix.kind === 'area') return withValue(p, fix.path, fix.toSqIn);
  const copy: any = structuredClone(p);
  const keys = fix.path.split('.');
  let o = copy;
  for (const k of keys.slice(0, -1)) o = o[k];
  const last = keys[keys.length - 1];
  o[last] = fix.kind === 'boolean' ? fix.to : o[last].filter((_: unknown, i: number) => i !== fix.index);
  return copy;
}

const failingKeys = async (p: Plan) => (await evaluate(set, p)).findings.filter((f) => f.status === 'fail' || f.status === 'caution').map((f) => f.ruleKey);

describe('fixes that change a plan value', () => {
  it('deepens the enclosure once for the depth, rear-zone and hinge-arm findings together', async () => {
    // Demo hall closet, 24 in deep units with 2 in of knobs and door, 1 in front and 4 in rear clearance
    // (the plan's maker figures), 3/4 in panel and doors. 31-1/2 in outside leaves 30 in inside:
    // maker's depth 31 in (1 in short); rear zone 30 − 27 = 3 in of the 6 in wanted (trade references, common
    // practice: 3 in short); hinge arms 30 − 30 = 0 of 2 in (common practice, no published source: 2 in short).
    const shallow = plan((p) => (p.enclosure.depth = 31.5));
    expect(await failingKeys(shallow)).toEqual(expect.arrayContaining(['clearances.depth', 'clearances.rear-zone', 'door-hardware.hinge-arm-room']));
    const fixes = await planFixes(set, shallow, await evaluate(set, shallow));
    const depth = fixes.find((f) => f.path === 'enclosure.depth') as LengthFix;
    // The largest of the three moves, 3 in: 34-1/2 in outside.
    expect(depth).toMatchObject({ fromIn: 31.5, toIn: 34.5 });
    expect(depth.clears).toEqual(expect.arrayContaining(['clearances.depth', 'clearances.rear-zone', 'door-hardware.hinge-arm-room']));
    const after = await failingKeys(withValue(shallow, depth.path, depth.toIn));
    expect(after).not.toContain('clearances.depth');
    expect(after).not.toContain('clearances.rear-zone');
    expect(after).not.toContain('door-hardware.hinge-arm-room');
  });

  it('moves a standpipe into its window from either side', async () => {
    // IRC P2706.2: 18 in to 42 in above the trap weir (TRADE.md, S).
    const low = plan((p) => (p.plumbing.standpipeHeight = 15));
    const up = (await planFixes(set, low, await evaluate(set, low))).find((f) => f.path === 'plumbing.standpipeHeight');
    expect(up).toMatchObject({ fromIn: 15, toIn: 18, clears: ['plumbing.standpipe-height'] });
    const high = plan((p) => (p.plumbing.standpipeHeight = 44));
    const down = (await planFixes(set, high, await evaluate(set, high))).find((f) => f.path === 'plumbing.standpipeHeight');
    expect(down).toMatchObject({ fromIn: 44, toIn: 42 });
  });

  it('shortens a transition duct to its limit, never asks for smaller appliances, and offers nothing when all passes', async () => {
    // IRC M1502.4.3: one transition duct at most 8 ft (TRADE.md, V).
    const long = plan((p) => (p.exhaust.transition.length = '9 ft'));
    const fixes = await planFixes(set, long, await evaluate(set, long));
    expect(fixes.find((f) => f.path === 'exhaust.transition.length')).toMatchObject({ fromIn: 108, toIn: 96 });
    const shallow = plan((p) => (p.enclosure.depth = 31.5));
    const paths = (await planFixes(set, shallow, await evaluate(set, shallow))).map((f) => f.path);
    expect(paths.some((p) => p.startsWith('washer.') || p.startsWith('dryer.'))).toBe(false);
    const fine = plan(() => {});
    expect(await planFixes(set, fine, await evaluate(set, fine))).toEqual([]);
  });

  it('rounds a metric fix up to a whole millimetre that passes', async () => {
    const metric = plan((p) => {
      // The demo's depths written with their units, so they keep their meaning on a metric plan.
      p.units = 'metric';
      for (const unit of [p.washer, p.dryer]) Object.assign(unit, { depth: '24 in', frontProjection: '2 in', clearances: { ...unit.clearances, front: '1 in', rear: '4 in' } });
      p.enclosure.panelThickness = '19 mm';
      for (const door of p.doors) door.thickness = '19 mm';
      p.enclosure.depth = '800 mm';
    });
    const depth = (await planFixes(set, metric, await evaluate(set, metric))).find((f) => f.path === 'enclosure.depth') as LengthFix;
    // 1 in = 25.4 mm exactly (NIST SP 811): the new depth is a whole number of millimetres.
    const mm = depth.toIn * 25.4;
    expect(Math.abs(mm - Math.round(mm))).toBeLessThan(1e-6);
    // 800 − 2 × 19 = 762 mm inside; the rear zone wants 24 + 2 + 1 + 6 in = 838.2 mm inside: 876.2 mm outside → 877 mm.
    expect(Math.round(mm)).toBe(877);
    expect(await failingKeys(withValue(metric, depth.path, depth.toIn))).not.toContain('clearances.rear-zone');
  });

  it('shortens a straight piece of a too-long exhaust route, or takes an elbow out of it', async () => {
    // IRC 2018 M1502.4.5.1: 35 ft (420 in) developed length; Table M1502.4.5.1: mitered 90° elbow 5 ft, 6-in
    // radius smooth 90° 1 ft 9 in. 24 + 300 + 18 in straight + 60 + 21 in of elbows = 423 in, 3 in too long.
    const long = plan((p) => (p.exhaust.run[2].straight = '25 ft'));
    expect(await failingKeys(long)).toEqual(['exhaust.developed-length']);
    const fixes = await planFixes(set, long, await evaluate(set, long));
    expect(fixes.find((f) => f.path === 'exhaust.run.2.straight')).toMatchObject({ kind: 'length', fromIn: 300, toIn: 297, clears: ['exhaust.developed-length'] });
    // The first elbow out: 423 − 60 = 363 in; only one item of the route is offered for removal.
    const removals = fixes.filter((f) => f.kind === 'remove-item');
    expect(removals).toEqual([{ kind: 'remove-item', path: 'exhaust.run', index: 1, label: 'Piece 2 (90° elbow)', clears: ['exhaust.developed-length'] }]);
    for (const fix of fixes) expect(await failingKeys(applied(long, fix))).toEqual([]);
  });

  it('enlarges a make-up air opening once for the closet minimum and the maker’s top vent together', async () => {
    // IMC 2018 504.6: at least 100 sq in of opening into a closet for a dryer; the demo dryer's maker asks for
    // 48 sq in at the top (plan figure). Top 30 + bottom 60 = 90 sq in: 10 short overall, 18 short at the top.
    const starved = plan((p) => (p.makeupAir.openings[0].netFreeArea = 30));
    expect(await failingKeys(starved)).toEqual(expect.arrayContaining(['makeup-air.closet-opening', 'makeup-air.maker-closet-vent']));
    const fixes = await planFixes(set, starved, await evaluate(set, starved));
    const top = fixes.find((f) => f.path === 'makeupAir.openings.0.netFreeArea');
    // The larger move, 18 sq in: 48 at the top, 108 in all.
    expect(top).toMatchObject({ kind: 'area', fromSqIn: 30, toSqIn: 48 });
    expect(top!.clears).toEqual(expect.arrayContaining(['makeup-air.closet-opening', 'makeup-air.maker-closet-vent']));
    expect(await failingKeys(applied(starved, top!))).toEqual([]);
    // The bottom opening cannot meet a top-vent figure: it is offered for the closet minimum alone (30 + 70 = 100).
    expect(fixes.find((f) => f.path === 'makeupAir.openings.1.netFreeArea')).toMatchObject({ fromSqIn: 60, toSqIn: 70, clears: ['makeup-air.closet-opening'] });
  });

  it('turns a yes/no answer round where that clears the finding', async () => {
    // IRC M1502.3: the terminal has a backdraft damper.
    const open = plan((p) => (p.exhaust.termination.backdraftDamper = false));
    const fixes = await planFixes(set, open, await evaluate(set, open));
    expect(fixes).toEqual([{ kind: 'boolean', path: 'exhaust.termination.backdraftDamper', label: expect.any(String), from: false, to: true, clears: ['exhaust.backdraft-damper'] }]);
    expect(await failingKeys(applied(open, fixes[0]))).toEqual([]);
  });
});
