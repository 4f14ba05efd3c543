import { z } from 'zod';
import type { FieldError } from '@/lib/domain/errors';
import { factsByName, isNumericKind, type FactKind } from '@/lib/domain/facts';
import { ruleSetParametersSchema } from '@/lib/domain/params';
import { areas, type StoredRule } from '@/lib/domain/rule-format/define';

const NUMERIC_OPERATORS = ['lessThan', 'lessThanInclusive', 'greaterThan', 'greaterThanInclusive'] as const;
export const operators = ['equal', 'notEqual', 'in', 'notIn', 'contains', 'doesNotContain', ...NUMERIC_OPERATORS] as const;

const valueRefSchema = z.union([
  z.number(),
  z.boolean(),
  z.string(),
  z.null(),
  z.array(z.union([z.number(), z.string(), z.boolean()])),
  z.object({ fact: z.string().min(1), path: z.string().optional() }).strict(),
]);

const leafSchema = z
  .object({
    name: z.string().min(1).describe('Name reported as the failed clause.'),
    fact: z.string().min(1),
    operator: z.string().min(1),
    value: valueRefSchema,
    path: z.string().optional(),
    params: z.record(z.string(), z.unknown()).optional(),
    priority: z.number().int().positive().optional(),
  })
  .strict();

export type StoredCondition =
  | z.infer<typeof leafSchema>
  | { name: string; all: StoredCondition[]; priority?: number }
  | { name: string; any: StoredCondition[]; priority?: number }
  | { name: string; not: StoredCondition; priority?: number }
  | { name: string; condition: string; priority?: number };

/** json-rules-engine condition JSON, with a name on every node so findings can say what failed. */
export const conditionSchema: z.ZodType<StoredCondition> = z.lazy(() =>
  z.union([
    leafSchema,
    z.object({ name: z.string().min(1), all: z.array(conditionSchema).min(1), priority: z.number().optional() }).strict(),
    z.object({ name: z.string().min(1), any: z.array(conditionSchema).min(1), priority: z.number().optional() }).strict(),
    z.object({ name: z.string().min(1), not: conditionSchema, priority: z.number().optional() }).strict(),
    z.object({ name: z.string().min(1), condition: z.string().min(1), priority: z.number().optional() }).strict(),
  ]),
);

const topLevelSchema = conditionSchema.refine((c) => !('fact' in c), 'The top level must be all, any, not or a condition reference.');

const citationSchema = z.object({ code: z.string().min(1), edition: z.string().nullable(), section: z.string().nullable() }).strict();
const confidenceSchema = z.enum(['V', 'S', 'M', 'CP']);

const limitSchema = z.union([valueRefSchema, z.object({ min: valueRefSchema, max: valueRefSchema }).strict()]);

/** The exact shape a published rule set version stores for each rule (JSON). */
export const storedRuleSchema = z
  .object({
    key: z.string().regex(/^[a-z][a-z0-9-]*\.[a-z0-9.-]+$/, 'Rule keys are dotted, e.g. exhaust.developed-length.').describe('Stable rule key.'),
    title: z.string().min(1).describe('Short title.'),
    area: z.enum(areas as unknown as [string, ...string[]]).describe('Check area.'),
    enabled: z.boolean().describe('Whether the rule runs in this rule set.'),
    severity: z.enum(['fail', 'caution']).describe('Outcome when the conditions are not met.'),
    citation: citationSchema.describe('Code, edition and section, resolved to the jurisdiction’s adopted edition.'),
    confidence: confidenceSchema.describe('Source confidence: verified, secondary, from memory, common practice.'),
    citationNote: z.string().nullable().describe('Why the citation needs confirming, if it does.'),
    citationVariants: z
      .object({
        base: citationSchema,
        variants: z
          .array(
            z
              .object({
                when: z.record(z.string(), z.union([z.boolean(), z.string()])),
                citation: citationSchema,
                confidence: confidenceSchema,
                citationNote: z.string().nullable(),
                messages: z.object({ pass: z.string(), fail: z.string(), notApplicable: z.string() }).partial().strict().optional(),
              })
              .strict(),
          )
          .max(8),
      })
      .strict()
      .optional()
      .describe('Citations for particular plans (a dwelling cites the IRC), used while the citation is still `base`.'),
    applicability: topLevelSchema.nullable().describe('When false the finding is not-applicable.'),
    conditions: topLevelSchema.describe('The passing state.'),
    requires: z.array(z.string().min(1)).describe('Facts the conditions need; a null one gives needs-info.'),
    measured: z.string().nullable().describe('Fact shown as the measured value.'),
    limit: limitSchema.nullable().describe('Value, fact or parameter shown as the limit.'),
    unit: z.enum(['length', 'area', 'cfm', 'count', 'amps', 'volts', 'boolean', 'text']).describe('Unit kind of measured and limit.'),
    lengthStyle: z.enum(['feet-inches', 'inches', 'decimal']).optional().describe('How lengths display.'),
    messages: z
      .object({ pass: z.string(), fail: z.string(), notApplicable: z.string() })
      .strict()
      .describe('Message templates; {measured} and {limit} are replaced with display values.'),
    remedy: z.string().nullable().describe('Remedy key.'),
  })
  .strict();

export type { FieldError };

type Leaf = z.infer<typeof leafSchema>;

function paramKind(path: string): FactKind | 'missing' {
  if (!path.startsWith('$.')) return 'missing';
  let schema: z.ZodType = ruleSetParametersSchema;
  for (const key of path.slice(2).split('.')) {
    while (schema instanceof z.ZodNullable || schema instanceof z.ZodOptional) schema = schema.unwrap() as z.ZodType;
    if (!(schema instanceof z.ZodObject)) return 'missing';
    const next = (schema.shape as Record<string, z.ZodType>)[key];
    if (!next) return 'missing';
    schema = next;
  }
  while (schema instanceof z.ZodNullable || schema instanceof z.ZodOptional) schema = schema.unwrap() as z.ZodType;
  if (schema instanceof z.ZodNumber) return 'length';
  if (schema instanceof z.ZodBoolean) return 'boolean';
  return 'text';
}

function* leaves(condition: StoredCondition, path: string): Generator<[Leaf, string]> {
  if ('fact' in condition) yield [condition, path];
  else if ('all' in condition) for (const [i, c] of condition.all.entries()) yield* leaves(c, `${path}.all.${i}`);
  else if ('any' in condition) for (const [i, c] of condition.any.entries()) yield* leaves(c, `${path}.any.${i}`);
  else if ('not' in condition) yield* leaves(condition.not, `${path}.not`);
}

/** Facts a condition tree reads, params excluded. */
export function conditionFacts(condition: StoredCondition | null): string[] {
  if (!condition) return [];
  const names = new Set<string>();
  for (const [leaf] of leaves(condition, '')) {
    if (leaf.fact !== 'params') names.add(leaf.fact);
    const value = leaf.value;
    if (value && typeof value === 'object' && !Array.isArray(value) && value.fact !== 'params') names.add(value.fact);
  }
  return [...names];
}

function refKind(ref: unknown, path: string, errors: FieldError[]): FactKind | 'literal' | null {
  if (ref === null || typeof ref !== 'object' || Array.isArray(ref)) return 'literal';
  const { fact, path: jsonPath } = ref as { fact: string; path?: string };
  if (fact === 'params') {
    const kind = paramKind(jsonPath ?? '');
    if (kind === 'missing') {
      errors.push({ path, message: `Unknown parameter '${jsonPath ?? ''}'.` });
      return null;
    }
    return kind;
  }
  const definition = factsByName.get(fact);
  if (!definition) {
    errors.push({ path, message: `Unknown fact '${fact}'.` });
    return null;
  }
  return definition.kind;
}

/**
 * Checks a rule against the fact catalog and the parameter schema: unknown facts, parameters and
 * operators, numeric operators on non-numeric facts, and condition facts missing from `requires`.
 */
export function validateRuleAgainstCatalog(rule: unknown): FieldError[] {
  const parsed = storedRuleSchema.safeParse(rule);
  if (!parsed.success) {
    return parsed.error.issues.map((issue) => ({ path: issue.path.map(String).join('.'), message: issue.message }));
  }
  const stored = parsed.data as StoredRule & { conditions: StoredCondition; applicability: StoredCondition | null };
  const errors: FieldError[] = [];
  const check = (condition: StoredCondition | null, root: string) => {
    if (!condition) return;
    for (const [leaf, path] of leaves(condition, root)) {
      if (!(operators as readonly string[]).includes(leaf.operator)) {
        errors.push({ path: `${path}.operator`, message: `Unknown operator '${leaf.operator}'; use one of ${operators.join(', ')}.` });
      }
      const factKind = refKind({ fact: leaf.fact, path: leaf.path }, `${path}.fact`, errors);
      refKind(leaf.value, `${path}.value`, errors);
      const numeric = (NUMERIC_OPERATORS as readonly string[]).includes(leaf.operator);
      if (numeric && factKind && factKind !== 'literal' && !isNumericKind(factKind)) {
        errors.push({ path: `${path}.operator`, message: `'${leaf.operator}' compares numbers, but '${leaf.fact}' is ${factKind}.` });
      }
    }
  };
  check(stored.applicability, 'applicability');
  check(stored.conditions, 'conditions');
  stored.requires.forEach((fact, i) => {
    if (!factsByName.has(fact)) errors.push({ path: `requires.${i}`, message: `Unknown fact '${fact}'.` });
  });
  for (const fact of conditionFacts(stored.conditions)) {
    if (!stored.requires.includes(fact)) {
      errors.push({ path: 'requires', message: `The conditions read '${fact}'; list it in requires so a missing value gives needs-info.` });
    }
  }
  stored.citationVariants?.variants.forEach((variant, i) => {
    for (const fact of Object.keys(variant.when)) {
      if (!factsByName.has(fact)) errors.push({ path: `citationVariants.variants.${i}.when`, message: `Unknown fact '${fact}'.` });
    }
  });
  if (stored.measured !== null && !factsByName.has(stored.measured)) {
    errors.push({ path: 'measured', message: `Unknown fact '${stored.measured}'.` });
  }
  if (stored.limit !== null && typeof stored.limit === 'object' && !Array.isArray(stored.limit)) {
    if ('min' in stored.limit) {
      refKind(stored.limit.min, 'limit.min', errors);
      refKind(stored.limit.max, 'limit.max', errors);
    } else refKind(stored.limit, 'limit', errors);
  }
  return errors;
}
