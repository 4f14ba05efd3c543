import type { z } from 'zod';
import type { UnitSystem } from '@/lib/domain/units';
import { isAreaPath, labelForPath } from '@/lib/domain/plan/labels';
import {
  canonicalPlanSchema,
  listLimitMessage,
  PLAN_LIST_LIMITS,
  planInputSchema,
  storedPlanSchema,
  unitSystemSchema,
  UNIT_ISSUE,
  type Plan,
  type PlanListPath,
} from '@/lib/domain/plan/schema';
import type { FieldError } from '@/lib/domain/errors';
import { entryAt, type NumberField } from '@/lib/domain/plan/registry';

export * from '@/lib/domain/plan/schema';
export * from '@/lib/domain/plan/registry';
export { isAreaPath, isPathWithin, labelForPath } from '@/lib/domain/plan/labels';
export * from '@/lib/domain/plan/editor';

export type { FieldError };

export type ParsePlanResult = { ok: true; plan: Plan } | { ok: false; errors: FieldError[] };

function joinPath(path: ReadonlyArray<PropertyKey>): string {
  return path.map(String).join('.');
}

const UNIT_WORDS: Record<NumberField['unit'], string> = { cfm: 'cubic feet per minute', A: 'amperes', V: 'volts' };
const EXPECTED_WORDS: Record<string, string> = {
  number: 'a number',
  string: 'text',
  boolean: 'yes or no',
  object: 'a group of fields',
  array: 'a list',
};
const MINUS = '\u2212';

function minusSign(value: number): string {
  return value < 0 ? `${MINUS}${String(-value)}` : String(value);
}

/** What was typed, quoted, cut short so a pasted essay never fills the message. */
function typed(input: unknown): string {
  if (typeof input === 'number') return `“${minusSign(input)}”`;
  if (typeof input === 'boolean') return input ? 'yes' : 'no';
  if (input === null) return 'nothing';
  if (typeof input === 'object') return Array.isArray(input) ? 'a list' : 'a group of fields';
  const text = String(input).replace(/\s+/g, ' ').trim();
  return `“${text.length > 40 ? `${text.slice(0, 39)}…` : text}”`;
}

function describeIssue(issue: z.core.$ZodIssue): FieldError[] {
  const path = joinPath(issue.path);
  const label = labelForPath(path);
  switch (issue.code) {
    case 'unrecognized_keys':
      return issue.keys.map((key) => {
        const fieldPath = path ? `${path}.${key}` : key;
        return {
          path: fieldPath,
          message: `${path ? label : 'Plan'}: unknown field '${key}'; remove it or check the spelling.`,
        };
      });
    case 'custom':
      // Unit-conversion issues carry a message written without the path; add the field's label.
      if (issue.params?.[UNIT_ISSUE]) return [{ path, message: `${label}${issue.message.replace(/^Value/, '')}` }];
      return [{ path, message: issue.message }];
    case 'invalid_type': {
      if (issue.input === undefined) return [{ path, message: `${label}: required.` }];
      const entry = entryAt(path)?.entry;
      if (entry?.kind === 'number') {
        return [{ path, message: `${label}: ${typed(issue.input)} is not a number; enter ${UNIT_WORDS[entry.unit]}, e.g. ${entry.example}.` }];
      }
      return [{ path, message: `${label}: ${typed(issue.input)} is not ${EXPECTED_WORDS[issue.expected] ?? issue.expected}.` }];
    }
    case 'too_small': {
      const entry = entryAt(path)?.entry;
      if (entry?.kind === 'number' && typeof issue.input === 'number') {
        const bound = issue.inclusive ? 'at least' : 'more than';
        return [{ path, message: `${label} must be ${bound} ${String(issue.minimum)} ${entry.unit} (you entered ${minusSign(issue.input)}).` }];
      }
      return [{ path, message: `${label}: ${issue.message}` }];
    }
    case 'invalid_value':
      if (issue.input === undefined) return [{ path, message: `${label}: required.` }];
      return [{ path, message: `${label}: ${typed(issue.input)} is not one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')}.` }];
    case 'invalid_union': {
      const nested = issue.errors.flat();
      if (nested.length > 0 && nested.every((n) => n.code === 'invalid_value')) {
        const values = nested.flatMap((n) => (n.code === 'invalid_value' ? n.values : []));
        if (issue.input === undefined) return [{ path, message: `${label}: required.` }];
        return [{ path, message: `${label}: ${typed(issue.input)} is not one of ${values.map((v) => JSON.stringify(v)).join(', ')}.` }];
      }
      const example = isAreaPath(path) ? '60 sq in or 387 cm²' : `30 in, 2' 6" or 762 mm`;
      return [{ path, message: `${label}: expected a number in the plan's units, or text with units such as ${example}.` }];
    }
    default:
      return [{ path, message: `${label}: ${issue.message}` }];
  }
}

/**
 * Validates a plan and converts every length to inches and every area to square inches, reading
 * bare numbers in the plan's own units. Errors name the field path (`enclosure.width`).
 */
export function parsePlan(input: unknown): ParsePlanResult {
  return parseWith(input, canonicalPlanSchema);
}

function parseWith(input: unknown, schemaFor: (units: UnitSystem) => z.ZodType): ParsePlanResult {
  const units = unitSystemSchema.safeParse((input as { units?: unknown } | null)?.units);
  const schema = units.success ? schemaFor(units.data as UnitSystem) : planInputSchema;
  // The input goes into issues so a message can say what was typed, not only what was wanted.
  const result = schema.safeParse(input, { reportInput: true });
  if (result.success && units.success) return { ok: true, plan: result.data as unknown as Plan };
  const issues = result.success ? [] : result.error.issues;
  const errors = issues.flatMap(describeIssue);
  if (!units.success && !errors.some((e) => e.path === 'units')) {
    errors.unshift({ path: 'units', message: "Units: must be 'imperial' or 'metric'." });
  }
  return { ok: false, errors };
}

/** A list of a stored plan that is longer than today's limit. */
export interface OversizeList {
  /** The list's path in the plan (`doors.0.hinges`). */
  path: string;
  count: number;
  max: number;
  message: string;
}

function field(value: unknown, key: string): unknown {
  return value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as Record<string, unknown>)[key] : undefined;
}

type BoundedList = { path: string; rule: PlanListPath; max: number; items: unknown[] };

/**
 * Every concrete list of the plan a limit applies to, with its path: `doors.*.hinges` expands per door,
 * over the doors within their own limit only (the rest are cut, so their hinges never matter).
 */
function boundedLists(plan: unknown): BoundedList[] {
  const out: BoundedList[] = [];
  const visit = (node: unknown, keys: string[], at: string[], pattern: string[], rule: PlanListPath, max: number) => {
    if (keys.length === 0) {
      if (Array.isArray(node)) out.push({ path: at.join('.'), rule, max, items: node });
      return;
    }
    const [key, ...rest] = keys;
    if (key === '*') {
      if (!Array.isArray(node)) return;
      const outer = PLAN_LIST_LIMITS.find((l) => l.path === pattern.join('.'))?.max ?? node.length;
      node.slice(0, outer).forEach((item, i) => visit(item, rest, [...at, String(i)], [...pattern, key], rule, max));
    } else {
      visit(field(node, key), rest, [...at, key], [...pattern, key], rule, max);
    }
  };
  for (const limit of PLAN_LIST_LIMITS) visit(plan, limit.path.split('.'), [], [], limit.path, limit.max);
  return out;
}

/**
 * The lists of a plan (as entered or canonical: both have the same shape) that are longer than the
 * limits allow. Cheap: it counts, it does not parse. Stored revisions from before the limits may have some.
 */
export function findOversizeLists(plan: unknown): OversizeList[] {
  return boundedLists(plan).flatMap(({ path, rule, max, items }) => {
    if (items.length <= max) return [];
    return [{ path, count: items.length, max, message: `${labelForPath(path)}: ${listLimitMessage(rule, items.length)}` }];
  });
}

/** A copy of the plan with every bounded list cut to its limit; the input is left as it is. */
export function truncateToLimits<T>(plan: T): T {
  if (findOversizeLists(plan).length === 0) return plan;
  const copy = structuredClone(plan);
  // Outer lists first (PLAN_LIST_LIMITS lists doors before their hinges), so no cut list is walked.
  for (const limit of PLAN_LIST_LIMITS) {
    for (const list of boundedLists(copy)) {
      if (list.rule === limit.path && list.items.length > list.max) list.items.splice(list.max);
    }
  }
  return copy;
}

export type StoredPlanResult = ParsePlanResult & { oversize: OversizeList[] };

/**
 * Reads a stored plan (a revision, or the plan kept with a check). Stored rows are never rewritten, so
 * one saved before today's limits may hold longer lists: those are reported in `oversize`, and the
 * plan returned is cut to the limits, so nothing downstream ever handles more than the limits allow.
 * The other fields are read as the schema reads new input.
 */
export function parseStoredPlan(input: unknown): StoredPlanResult {
  const oversize = findOversizeLists(input);
  const result = parseWith(oversize.length ? truncateToLimits(input) : input, storedPlanSchema);
  return { ...result, oversize };
}
