import type { StoredRule } from '@/lib/domain/rule-format';
import { sameJson } from '@/lib/domain/rule-sets/stable-json';

export type ValueChange = { path: string; from: unknown; to: unknown };

export type RuleChange = { key: string; title: string; fields: ValueChange[] };

export interface RuleSetDiff {
  parameters: ValueChange[];
  rules: { added: StoredRule[]; removed: StoredRule[]; changed: RuleChange[]; unchanged: number };
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/**
 * Leaf-by-leaf differences between two JSON values. Objects are walked key by key; arrays and
 * scalars are compared whole, because a reordered hinge chart or condition list is one change to
 * review, not many.
 */
export function diffValues(from: unknown, to: unknown, path = ''): ValueChange[] {
  if (isPlainObject(from) && isPlainObject(to)) {
    const keys = [...new Set([...Object.keys(from), ...Object.keys(to)])];
    return keys.flatMap((key) => diffValues(from[key], to[key], path ? `${path}.${key}` : key));
  }
  return sameJson(from, to) ? [] : [{ path: path || '(value)', from: from ?? null, to: to ?? null }];
}

// Rule fields shown as one unit each: a condition tree is reviewed as a whole.
const RULE_FIELDS: readonly (keyof StoredRule)[] = [
  'title', 'area', 'enabled', 'severity', 'citation', 'confidence', 'citationNote', 'applicability', 'conditions',
  'requires', 'measured', 'limit', 'unit', 'lengthStyle', 'messages', 'remedy', 'citationVariants',
];

function diffRule(from: StoredRule, to: StoredRule): ValueChange[] {
  const changes: ValueChange[] = [];
  for (const field of RULE_FIELDS) {
    const a = from[field];
    const b = to[field];
    if (sameJson(a, b)) continue;
    // Citations and messages are small objects whose parts an admin edits one by one.
    if ((field === 'citation' || field === 'messages') && isPlainObject(a) && isPlainObject(b)) changes.push(...diffValues(a, b, field));
    else changes.push({ path: field, from: a ?? null, to: b ?? null });
  }
  return changes;
}

/** What changed from one rule set version to another: parameters, and rules added, removed and changed (by key). */
export function diffRuleSets(
  from: { parameters: unknown; rules: StoredRule[] },
  to: { parameters: unknown; rules: StoredRule[] },
): RuleSetDiff {
  const before = new Map(from.rules.map((r) => [r.key, r]));
  const after = new Map(to.rules.map((r) => [r.key, r]));
  const added = to.rules.filter((r) => !before.has(r.key));
  const removed = from.rules.filter((r) => !after.has(r.key));
  const changed: RuleChange[] = [];
  let unchanged = 0;
  for (const rule of to.rules) {
    const old = before.get(rule.key);
    if (!old) continue;
    const fields = diffRule(old, rule);
    if (fields.length) changed.push({ key: rule.key, title: rule.title, fields });
    else unchanged += 1;
  }
  return { parameters: diffValues(from.parameters, to.parameters), rules: { added, removed, changed, unchanged } };
}

export function isEmptyDiff(diff: RuleSetDiff): boolean {
  return diff.parameters.length === 0 && diff.rules.added.length === 0 && diff.rules.removed.length === 0 && diff.rules.changed.length === 0;
}
