import { evaluate, type Finding, type RuleSetForEvaluation } from '@/lib/domain/engine';
import type { Plan } from '@/lib/domain/plan';
import type { StoredCondition, StoredRule } from '@/lib/domain/rule-format';
import { roundUpToMeasure } from '@/lib/domain/sizing/rounding';

export type Dimension = 'width' | 'depth' | 'height';
export const DIMENSIONS: readonly Dimension[] = ['width', 'depth', 'height'];
export type BySize = Record<Dimension, number | null>;

export interface SizeConstraint {
  ruleKey: string;
  title: string;
  severity: StoredRule['severity'];
  dimension: Dimension;
  /** Inside size this rule asks for, canonical inches. */
  insideIn: number;
}

export interface EnclosureSizing {
  /** The units alone, without any clearance: less than this cannot be built. */
  physicalInside: BySize;
  constraints: SizeConstraint[];
  /** Smallest inside size passing every fail-severity rule (and fitting the units). */
  smallestInside: BySize;
  /** Smallest inside size that also clears every caution-severity rule. */
  comfortableInside: BySize;
  /** The same two as outside sizes, when the panel thickness is known. */
  smallestOutside: BySize;
  comfortableOutside: BySize;
  /** The plan's inside size, where it is given. */
  currentInside: BySize;
  /** Current minus smallest: positive is room to spare, negative is what is lacking. */
  spare: BySize;
  /** Current minus comfortable. */
  spareComfortable: BySize;
}

// A probe enclosure far larger than any closet, measured inside, so every size rule's measure can be read
// without the installer's own (possibly still blank) enclosure.
const PROBE_IN = 240;

const empty = (): BySize => ({ width: null, depth: null, height: null });

function leafOn(condition: StoredCondition | null, fact: string): { operator: string } | null {
  if (!condition) return null;
  if ('fact' in condition) return condition.fact === fact ? { operator: condition.operator } : null;
  const children = 'all' in condition ? condition.all : 'any' in condition ? condition.any : [];
  for (const child of children) {
    const hit = leafOn(child, fact);
    if (hit) return hit;
  }
  return null;
}

/** True when the rule passes while its measured value is at least its limit (a minimum, not a maximum). */
export function isMinimumRule(rule: StoredRule): boolean {
  if (!rule.measured) return false;
  const leaf = leafOn(rule.conditions as StoredCondition, rule.measured);
  return leaf?.operator === 'greaterThanInclusive' || leaf?.operator === 'greaterThan';
}

function probePlan(plan: Plan, size: Record<Dimension, number>): Plan {
  return { ...plan, enclosure: { ...plan.enclosure, width: size.width, depth: size.depth, height: size.height, depthMeasured: 'inside' } } as Plan;
}

const asNumber = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/** The units themselves, side by side or stacked; null while a size is missing. */
export function physicalInside(plan: Plan): BySize {
  const w = plan.washer;
  const d = plan.dryer;
  const arrangement = plan.arrangement;
  const sum = (...xs: Array<number | undefined>) => (xs.every((x) => typeof x === 'number') ? (xs as number[]).reduce((a, b) => a + b, 0) : null);
  const max = (...xs: Array<number | null>) => (xs.every((x) => x !== null) ? Math.max(...(xs as number[])) : null);
  const reach = (u: typeof w) => sum(u?.depth, u?.frontProjection);
  return {
    width: arrangement === 'stacked' ? max(w?.width ?? null, d?.width ?? null) : arrangement ? sum(w?.width, d?.width) : null,
    depth: max(reach(w), reach(d)),
    height: arrangement === 'stacked' ? sum(w?.height, d?.height) : arrangement ? max(w?.height ?? null, d?.height ?? null) : null,
  };
}

/** Thickness the closed doors add to an outside depth: the thickest door, else one panel (as the facts count it). */
function doorAllowanceIn(plan: Plan, panel: number): number {
  const doors = plan.doors;
  if (doors === undefined) return panel;
  return doors.reduce((max, door) => Math.max(max, door.thickness ?? panel), 0);
}

export function outsideFromInside(plan: Plan, inside: BySize): BySize {
  const panel = plan.enclosure?.panelThickness;
  if (typeof panel !== 'number') return empty();
  return {
    width: inside.width === null ? null : inside.width + 2 * panel,
    depth: inside.depth === null ? null : inside.depth + panel + doorAllowanceIn(plan, panel),
    height: inside.height === null ? null : inside.height + panel,
  };
}

export function currentInside(plan: Plan): BySize {
  const e = plan.enclosure;
  if (!e) return empty();
  const out = empty();
  for (const dim of DIMENSIONS) {
    const measured = e[dim];
    if (typeof measured !== 'number') continue;
    if (e.depthMeasured === 'inside') out[dim] = measured;
    else if (e.depthMeasured === 'outside' && typeof e.panelThickness === 'number') {
      const panel = e.panelThickness;
      out[dim] = dim === 'width' ? measured - 2 * panel : dim === 'depth' ? measured - panel - doorAllowanceIn(plan, panel) : measured - panel;
    }
  }
  return out;
}

/**
 * Which size rules move one for one with an enclosure dimension, and the inside size each asks for. The
 * plan is evaluated in a probe enclosure and again with each dimension one inch larger: a minimum rule whose
 * measure grows by exactly that inch is a size rule of that dimension. Nothing here names a rule or a fact,
 * so a rule an AHJ adds, or a severity it changes, is sized the same way.
 */
export async function sizeConstraints(ruleSet: RuleSetForEvaluation, plan: Plan): Promise<SizeConstraint[]> {
  const base = { width: PROBE_IN, depth: PROBE_IN, height: PROBE_IN };
  const [baseline, ...moved] = await Promise.all([
    evaluate(ruleSet, probePlan(plan, base)),
    ...DIMENSIONS.map((dim) => evaluate(ruleSet, probePlan(plan, { ...base, [dim]: PROBE_IN + 1 }))),
  ]);
  const rulesByKey = new Map(ruleSet.rules.map((r) => [r.key, r]));
  const byKey = (findings: Finding[]) => new Map(findings.map((f) => [f.ruleKey, f]));
  const movedByDim = moved.map((e) => byKey(e.findings));
  const constraints: SizeConstraint[] = [];
  for (const finding of baseline.findings) {
    const rule = rulesByKey.get(finding.ruleKey);
    const measured = asNumber(finding.measured);
    const limit = asNumber(finding.limit);
    if (!rule || measured === null || limit === null || !isMinimumRule(rule)) continue;
    if (finding.status === 'not-applicable' || finding.status === 'needs-info') continue;
    const dims = DIMENSIONS.filter((_, i) => {
      const after = asNumber(movedByDim[i].get(rule.key)?.measured);
      return after !== null && Math.abs(after - measured - 1) < 1e-6;
    });
    if (dims.length !== 1) continue;
    constraints.push({ ruleKey: rule.key, title: rule.title, severity: rule.severity, dimension: dims[0], insideIn: PROBE_IN + (limit - measured) });
  }
  return constraints;
}

/**
 * The smallest enclosure for the chosen units: inside and outside, for the fail-severity rules and for all
 * rules, and what the plan's own enclosure leaves to spare (or lacks) in each direction. Sizes are rounded up
 * to what can be measured in the plan's units (1/16 in, 1 mm).
 */
export async function sizeEnclosure(ruleSet: RuleSetForEvaluation, plan: Plan): Promise<EnclosureSizing> {
  const constraints = await sizeConstraints(ruleSet, plan);
  const physical = physicalInside(plan);
  const pick = (severities: ReadonlySet<string>): BySize => {
    const out = empty();
    for (const dim of DIMENSIONS) {
      const needs = constraints.filter((c) => c.dimension === dim && severities.has(c.severity)).map((c) => c.insideIn);
      if (physical[dim] !== null) needs.push(physical[dim]!);
      out[dim] = needs.length > 0 ? roundUpToMeasure(Math.max(...needs), plan.units) : null;
    }
    return out;
  };
  const smallestInside = pick(new Set(['fail']));
  const comfortableInside = pick(new Set(['fail', 'caution']));
  const current = currentInside(plan);
  const diff = (a: BySize, b: BySize): BySize => {
    const out = empty();
    for (const dim of DIMENSIONS) out[dim] = a[dim] === null || b[dim] === null ? null : a[dim]! - b[dim]!;
    return out;
  };
  return {
    physicalInside: physical,
    constraints,
    smallestInside,
    comfortableInside,
    smallestOutside: outsideFromInside(plan, smallestInside),
    comfortableOutside: outsideFromInside(plan, comfortableInside),
    currentInside: current,
    spare: diff(current, smallestInside),
    spareComfortable: diff(current, comfortableInside),
  };
}
