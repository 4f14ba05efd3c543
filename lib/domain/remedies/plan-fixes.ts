import { evaluate, type Evaluation, type Finding, type RuleSetForEvaluation } from '@/lib/domain/engine';
import { computeFacts, factsByName } from '@/lib/domain/facts';
import { entryAt, labelForPath, type Plan } from '@/lib/domain/plan';
import type { StoredCondition, StoredRule } from '@/lib/domain/rule-format';
import { roundDownAreaToMeasure, roundDownToMeasure, roundUpAreaToMeasure, roundUpToMeasure } from '@/lib/domain/sizing/rounding';

interface FixBase {
  /** The plan value changed (for `remove-item`, the list). */
  path: string;
  label: string;
  /** The failing findings it clears, in rule-set order. */
  clears: string[];
}
/** A length set to a new value (canonical inches). */
export interface LengthFix extends FixBase {
  kind: 'length';
  fromIn: number;
  toIn: number;
}
/** An area set to a new value (canonical square inches). */
export interface AreaFix extends FixBase {
  kind: 'area';
  fromSqIn: number;
  toSqIn: number;
}
/** A yes/no answer turned round (a damper fitted, a label put up, protection added). */
export interface BooleanFix extends FixBase {
  kind: 'boolean';
  from: boolean;
  to: boolean;
}
/** One item taken out of a list (an elbow out of the exhaust route). */
export interface RemoveItemFix extends FixBase {
  kind: 'remove-item';
  index: number;
}
/** One plan change, the findings it clears, and the value before and after. */
export type PlanFix = LengthFix | AreaFix | BooleanFix | RemoveItemFix;

// The appliances' own figures come from the maker: a fix never asks for a smaller washer.
const MAKER_FIGURES = /^(washer|dryer)\./;
const EPSILON = 1e-6;

const asNumber = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

function getAt(obj: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((o, k) => (o == null ? undefined : (o as Record<string, unknown>)[k]), obj);
}

function withValue(plan: Plan, path: string, value: unknown): Plan {
  const copy = structuredClone(plan) as unknown as Record<string, unknown>;
  const keys = path.split('.');
  let o = copy;
  for (const k of keys.slice(0, -1)) o = o[k] as Record<string, unknown>;
  o[keys[keys.length - 1]] = value;
  return copy as unknown as Plan;
}

function withoutItem(plan: Plan, listPath: string, index: number): Plan {
  const list = getAt(plan, listPath) as unknown[];
  return withValue(plan, listPath, list.filter((_, i) => i !== index));
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

/** The plan values under a fact's paths, down to single fields: list items and groups opened up. */
function leaves(plan: Plan, path: string): Array<{ path: string; value: unknown }> {
  const value = getAt(plan, path);
  if (Array.isArray(value)) return value.flatMap((_, i) => leaves(plan, `${path}.${i}`));
  if (value !== null && typeof value === 'object') return Object.keys(value).flatMap((k) => leaves(plan, `${path}.${k}`));
  return value === undefined ? [] : [{ path, value }];
}

function settableLeaves(rule: StoredRule, plan: Plan, kinds: ReadonlyArray<string>) {
  const definition = rule.measured ? factsByName.get(rule.measured) : undefined;
  if (!definition) return { definition, fields: [] };
  const fields = definition.planPaths
    .filter((path) => !path.includes('*') && !MAKER_FIGURES.test(path))
    .flatMap((path) => leaves(plan, path))
    .filter((leaf) => !MAKER_FIGURES.test(leaf.path) && kinds.includes(entryAt(leaf.path)?.entry.kind ?? ''));
  return { definition, fields };
}

/** Plan length or area fields the installer can set that move this rule's measure one for one. */
function oneForOneFields(rule: StoredRule, plan: Plan, params: RuleSetForEvaluation['parameters'], measured: number): string[] {
  const { definition, fields } = settableLeaves(rule, plan, ['length', 'area']);
  if (!definition || (definition.kind !== 'length' && definition.kind !== 'area')) return [];
  return fields
    .filter((leaf) => entryAt(leaf.path)?.entry.kind === definition.kind && asNumber(leaf.value) !== null)
    .map((leaf) => leaf.path)
    .filter((path) => {
      const after = asNumber(computeFacts(withValue(plan, path, (getAt(plan, path) as number) + 1), params)[rule.measured!]);
      return after !== null && Math.abs(after - measured - 1) < EPSILON;
    });
}

/** Lists behind this rule's measure whose items add to it without a length of their own (elbows in a route). */
function removableItems(rule: StoredRule, plan: Plan): Array<{ path: string; index: number }> {
  const definition = rule.measured ? factsByName.get(rule.measured) : undefined;
  if (!definition || definition.kind !== 'length') return [];
  return definition.planPaths.flatMap((path) => {
    const list = getAt(plan, path);
    if (path.includes('*') || MAKER_FIGURES.test(path) || entryAt(path)?.entry.kind !== 'list' || !Array.isArray(list)) return [];
    return list.flatMap((_, index) => {
      const numeric = leaves(plan, `${path}.${index}`).some((l) => asNumber(l.value) !== null && entryAt(l.path)?.entry.kind === 'length');
      return numeric ? [] : [{ path, index }];
    });
  });
}

const failing = (f: Finding) => f.status === 'fail' || f.status === 'caution';

function itemLabel(listPath: string, index: number, plan: Plan): string {
  const entry = entryAt(listPath)?.entry;
  const name = entry?.kind === 'list' && entry.itemLabel ? entry.itemLabel : 'Item';
  const item = getAt(plan, `${listPath}.${index}`) as Record<string, unknown> | undefined;
  const elbow = item && typeof item.elbow === 'number' ? ` (${item.elbow}° elbow)` : '';
  return `${name} ${index + 1}${elbow}`;
}

/**
 * The changes to plan values that clear failing findings. Findings whose measure the same field moves are
 * solved together (the largest move covers them all), so one deeper enclosure clears the depth, rear-zone and
 * hinge-arm findings at once; a route piece shortened or an opening enlarged likewise covers every finding its
 * length or area moves. Besides lengths and areas: a yes/no answer turned round, and an elbow taken out of a
 * route. Each fix is checked by evaluating the changed plan: it must clear every finding it names and turn no
 * other finding into a failure, or it is not offered.
 */
export async function planFixes(ruleSet: RuleSetForEvaluation, plan: Plan, evaluation: Evaluation): Promise<PlanFix[]> {
  const rules = new Map(ruleSet.rules.map((r) => [r.key, r]));
  const moves = new Map<string, { up: number; down: number; keys: string[] }>();
  const flips = new Map<string, { from: boolean; keys: string[] }>();
  const removals = new Map<string, { path: string; index: number; keys: string[] }>();
  for (const finding of evaluation.findings) {
    const rule = rules.get(finding.ruleKey);
    if (!rule || !failing(finding)) continue;
    const definition = rule.measured ? factsByName.get(rule.measured) : undefined;
    if (definition?.kind === 'boolean') {
      for (const leaf of settableLeaves(rule, plan, ['boolean']).fields) {
        if (typeof leaf.value !== 'boolean') continue;
        const entry = flips.get(leaf.path) ?? { from: leaf.value, keys: [] };
        entry.keys.push(rule.key);
        flips.set(leaf.path, entry);
      }
      continue;
    }
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
    if (move < 0) {
      for (const item of removableItems(rule, plan)) {
        const id = `${item.path}.${item.index}`;
        const entry = removals.get(id) ?? { ...item, keys: [] };
        entry.keys.push(rule.key);
        removals.set(id, entry);
      }
    }
  }

  const before = new Map(evaluation.findings.map((f) => [f.ruleKey, f.status]));
  const breaksNone = (after: Evaluation) => after.findings.every((f) => !failing(f) || failing({ status: before.get(f.ruleKey) } as Finding));
  const passing = async (changed: Plan) => {
    const after = await evaluate(ruleSet, changed);
    return { status: new Map(after.findings.map((f) => [f.ruleKey, f.status])), breaksNone: breaksNone(after) };
  };

  const fixes: PlanFix[] = [];
  for (const [path, { up, down, keys }] of moves) {
    // Asked to grow and to shrink at once: no single value of this field clears them all.
    if (up > 0 && down < 0) continue;
    const isArea = entryAt(path)?.entry.kind === 'area';
    const from = asNumber(getAt(plan, path))!;
    const to = isArea
      ? up > 0 ? roundUpAreaToMeasure(from + up, plan.units) : roundDownAreaToMeasure(from + down, plan.units)
      : up > 0 ? roundUpToMeasure(from + up, plan.units) : roundDownToMeasure(from + down, plan.units);
    // A list item's size shrinks to something, never to nothing (a route piece of no length is no piece).
    if (to < 0 || (to === 0 && /\.\d+\./.test(path))) continue;
    const after = await passing(withValue(plan, path, to));
    if (!keys.every((k) => after.status.get(k) === 'pass') || !after.breaksNone) continue;
    const clears = [...new Set(keys)];
    const label = labelForPath(path);
    fixes.push(isArea ? { kind: 'area', path, label, fromSqIn: from, toSqIn: to, clears } : { kind: 'length', path, label, fromIn: from, toIn: to, clears });
  }

  for (const [path, { from, keys }] of flips) {
    const after = await passing(withValue(plan, path, !from));
    const clears = [...new Set(keys)].filter((k) => after.status.get(k) === 'pass');
    if (clears.length === 0 || !after.breaksNone) continue;
    fixes.push({ kind: 'boolean', path, label: labelForPath(path), from, to: !from, clears });
  }

  // One item out of each list at most: the first whose removal clears every finding asking for a shorter route.
  const removed = new Set<string>();
  for (const { path, index, keys } of removals.values()) {
    if (removed.has(path)) continue;
    const after = await passing(withoutItem(plan, path, index));
    if (!keys.every((k) => after.status.get(k) === 'pass') || !after.breaksNone) continue;
    removed.add(path);
    fixes.push({ kind: 'remove-item', path, index, label: itemLabel(path, index, plan), clears: [...new Set(keys)] });
  }
  return fixes;
}
