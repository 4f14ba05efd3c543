import { evaluate, type Evaluation, type Finding, type RuleSetForEvaluation } from '@/lib/domain/engine';
import { computeFacts, factsByName } from '@/lib/domain/facts';
import { entryAt, labelForPath, type Plan } from '@/lib/domain/plan';
import type { StoredCondition, StoredRule } from '@/lib/domain/rule-format';
import { roundDownToMeasure, roundUpToMeasure } from '@/lib/domain/sizing/rounding';

/** One plan value to change, the findings the change clears, and the value before and after (canonical inches). */
export interface PlanFix {
  path: string;
  label: string;
  fromIn: number;
  toIn: number;
  /** The failing findings it clears, in rule-set order. */
  clears: string[];
}

// The appliances' own figures come from the maker: a fix never asks for a smaller washer.
const MAKER_FIGURES = /^(washer|dryer)\./;
const EPSILON = 1e-6;

const asNumber = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

function getAt(obj: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((o, k) => (o == null ? undefined : (o as Record<string, unknown>)[k]), obj);
}

function withValue(plan: Plan, path: string, value: number): Plan {
  const copy = structuredClone(plan) as unknown as Record<string, unknown>;
  const keys = path.split('.');
  let o = copy;
  for (const k of keys.slice(0, -1)) o = o[k] as Record<string, unknown>;
  o[keys[keys.length - 1]] = value;
  return copy as unknown as Plan;
}

function leafOperator(condition: StoredCondition | null, fact: string): string | null {
  if (!condition) return null;
  if ('fact' in condition) return condition.fact === fact ? condition.operator : null;
  const children = 'all' in condition ? condition.all : 'any' in condition ? condition.any : [];
  for (const child of children) {
    const op = leafOperator(child, fact);
    if (op) return op;
  }
  return null;
}

/** How far the measured value must move to pass: positive to grow, negative to shrink, null when unknown. */
function neededMove(rule: StoredRule, finding: Finding): number | null {
  const measured = asNumber(finding.measured);
  if (measured === null || !rule.measured) return null;
  const limit = finding.limit;
  if (limit !== null && typeof limit === 'object') {
    if (measured < limit.min) return limit.min - measured;
    if (measured > limit.max) return limit.max - measured;
    return null;
  }
  const bound = asNumber(limit);
  if (bound === null) return null;
  const op = leafOperator(rule.conditions as StoredCondition, rule.measured);
  if ((op === 'greaterThanInclusive' || op === 'greaterThan') && measured < bound) return bound - measured + (op === 'greaterThan' ? EPSILON : 0);
  if ((op === 'lessThanInclusive' || op === 'lessThan') && measured > bound) return bound - measured - (op === 'lessThan' ? EPSILON : 0);
  return null;
}

/** Plan length fields the installer can set that move this rule's measure one for one. */
function oneForOneFields(rule: StoredRule, plan: Plan, params: RuleSetForEvaluation['parameters'], measured: number): string[] {
  const definition = rule.measured ? factsByName.get(rule.measured) : undefined;
  if (!definition || definition.kind !== 'length') return [];
  return definition.planPaths.filter((path) => {
    if (path.includes('*') || MAKER_FIGURES.test(path) || entryAt(path)?.entry.kind !== 'length') return false;
    const value = asNumber(getAt(plan, path));
    if (value === null) return false;
    const after = asNumber(computeFacts(withValue(plan, path, value + 1), params)[rule.measured!]);
    return after !== null && Math.abs(after - measured - 1) < EPSILON;
  });
}

const failing = (f: Finding) => f.status === 'fail' || f.status === 'caution';

/**
 * The changes to plan values that clear failing findings. Findings whose measure the same field moves are
 * solved together (the largest move covers them all), so one deeper enclosure clears the depth, rear-zone and
 * hinge-arm findings at once. Each fix is checked by evaluating the changed plan: it must clear every finding
 * it names and turn no other finding into a failure, or it is not offered.
 */
export async function planFixes(ruleSet: RuleSetForEvaluation, plan: Plan, evaluation: Evaluation): Promise<PlanFix[]> {
  const rules = new Map(ruleSet.rules.map((r) => [r.key, r]));
  const moves = new Map<string, { up: number; down: number; keys: string[] }>();
  for (const finding of evaluation.findings) {
    const rule = rules.get(finding.ruleKey);
    if (!rule || !failing(finding)) continue;
    const move = neededMove(rule, finding);
    const measured = asNumber(finding.measured);
    if (move === null || measured === null) continue;
    for (const path of oneForOneFields(rule, plan, ruleSet.parameters, measured)) {
      const entry = moves.get(path) ?? { up: 0, down: 0, keys: [] };
      if (move > 0) entry.up = Math.max(entry.up, move);
      else entry.down = Math.min(entry.down, move);
      entry.keys.push(rule.key);
      moves.set(path, entry);
    }
  }

  const before = new Map(evaluation.findings.map((f) => [f.ruleKey, f.status]));
  const fixes: PlanFix[] = [];
  for (const [path, { up, down, keys }] of moves) {
    // Asked to grow and to shrink at once: no single value of this field clears them all.
    if (up > 0 && down < 0) continue;
    const fromIn = asNumber(getAt(plan, path))!;
    const toIn = up > 0 ? roundUpToMeasure(fromIn + up, plan.units) : roundDownToMeasure(fromIn + down, plan.units);
    if (toIn < 0) continue;
    const after = await evaluate(ruleSet, withValue(plan, path, toIn));
    const status = new Map(after.findings.map((f) => [f.ruleKey, f.status]));
    const clearsAll = keys.every((k) => status.get(k) === 'pass');
    const breaksNone = after.findings.every((f) => !failing(f) || failing({ status: before.get(f.ruleKey) } as Finding));
    if (!clearsAll || !breaksNone) continue;
    fixes.push({ path, label: labelForPath(path), fromIn, toIn, clears: [...new Set(keys)] });
  }
  return fixes;
}
