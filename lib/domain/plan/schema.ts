import { z } from 'zod';
import { parseArea, parseLength, type UnitSystem } from '@/lib/domain/units';
import {
  MAX_DOORS,
  MAX_EXHAUST_RUN_PIECES,
  MAX_HINGES_PER_DOOR,
  MAX_MEASURE_TEXT_LENGTH,
  PLAN_LIST_LIMITS,
  planRegistry,
  type PlanEntry,
  type PlanListPath,
  type PlanRegistry,
} from '@/lib/domain/plan/registry';

export {
  adjoiningRooms,
  doorKinds,
  drainDestinations,
  ductMaterials,
  fittingKinds,
  MAX_DOORS,
  MAX_EXHAUST_RUN_PIECES,
  MAX_HINGES_PER_DOOR,
  MAX_MAKEUP_AIR_OPENINGS,
  MAX_MEASURE_TEXT_LENGTH,
  MAX_RECEPTACLES,
  PLAN_LIST_LIMITS,
  spaceKinds,
  type PlanListPath,
} from '@/lib/domain/plan/registry';

/** The message for a list over its limit, without the field label (the parser adds it). */
export function listLimitMessage(path: PlanListPath, count: number): string {
  const limit = PLAN_LIST_LIMITS.find((l) => l.path === path)!;
  return `at most ${limit.max} ${limit.noun}; this plan has ${count.toLocaleString('en-US')}.`;
}

export function textLimitMessage(length: number): string {
  return `at most ${MAX_MEASURE_TEXT_LENGTH} characters; this has ${length.toLocaleString('en-US')}.`;
}

/*
 * The plan's static types, read off the registry: what the schemas below take (`input`: lengths and
 * areas as number | text) and give (`output`: canonical inches and square inches).
 */
type Mode = 'input' | 'output';
type Simplify<T> = { [K in keyof T]: T[K] } & {};
type Nullable<N> = N extends { none: { answer: 'null' } } ? null : never;
type Value<N, M extends Mode> = N extends { kind: 'length' | 'area' }
  ? (M extends 'input' ? number | string : number) | Nullable<N>
  : N extends { kind: 'number' }
    ? number
    : N extends { kind: 'boolean' }
      ? boolean
      : N extends { kind: 'text' }
        ? string
      : N extends { kind: 'choice'; choices: readonly (infer V)[] }
        ? V | Nullable<N>
        : N extends { kind: 'group'; fields: infer F }
          ? GroupValue<F, M> | Nullable<N>
          : N extends { kind: 'list'; item: infer I }
            ? Array<Value<I, M>>
            : never;
type GroupValue<F, M extends Mode> = Simplify<
  { -readonly [K in keyof F as F[K] extends { required: true } ? K : never]: Value<F[K], M> } & {
    -readonly [K in keyof F as F[K] extends { required: true } ? never : K]?: Value<F[K], M>;
  }
>;
type RegistryInput = Value<PlanRegistry, 'input'>;
type RegistryOutput = Value<PlanRegistry, 'output'>;

type FieldFactory = (description: string) => z.ZodType;

/** A measure written as text, capped so a huge string never reaches the unit parser. */
function measureText(bounded: boolean) {
  return bounded
    ? z.string().max(MAX_MEASURE_TEXT_LENGTH, { error: (issue) => textLimitMessage((issue.input as string).length) })
    : z.string();
}

/**
 * One builder, walking the registry, yields both the raw input schema (lengths as number | string, no
 * transforms, so `z.toJSONSchema` and zodResolver can use it) and the converting schemas that turn every
 * length and area into canonical inches / square inches for a given unit system.
 * Stored plans are read without the limits (bounded = false), so a revision saved before them still opens.
 */
function buildEntry(entry: PlanEntry, path: string, length: FieldFactory, area: FieldFactory, bounded: boolean): z.ZodType {
  const child = (e: PlanEntry, key: string) => {
    const schema = buildEntry(e, path ? `${path}.${key}` : key, length, area, bounded);
    if (e.required) return schema;
    if (e.none?.answer === 'null') return schema.nullish().describe(schema.description ?? '');
    return schema.optional();
  };
  switch (entry.kind) {
    case 'length':
      return length(entry.help);
    case 'area':
      return area(entry.help);
    case 'number':
      return (entry.min === 'positive' ? z.number().positive() : z.number().nonnegative()).describe(entry.help);
    case 'boolean':
      return z.boolean().describe(entry.help);
    case 'text': {
      const text = entry.format === 'uuid' ? z.uuid() : z.string().trim().min(1);
      return (bounded ? text.max(entry.maxLength) : text).describe(entry.help);
    }
    case 'choice': {
      if (entry.choices.every((c) => typeof c === 'string')) {
        return z.enum(entry.choices as unknown as [string, ...string[]]).describe(entry.help);
      }
      const literals = entry.choices.map((c) => z.literal(c));
      return z.union(literals as unknown as [z.ZodLiteral, z.ZodLiteral, ...z.ZodLiteral[]]).describe(entry.help);
    }
    case 'group':
      return z
        .object(Object.fromEntries(Object.entries(entry.fields).map(([key, e]) => [key, child(e, key)])))
        .strict()
        .describe(entry.help);
    case 'list': {
      const listPath = path as PlanListPath;
      const plain = z.array(buildEntry(entry.item, `${path}.*`, length, area, bounded));
      const limited = bounded
        ? plain.max(entry.max, { error: (issue) => listLimitMessage(listPath, (issue.input as unknown[]).length) })
        : plain;
      return limited.describe(entry.help);
    }
  }
}

function buildPlanSchema(length: FieldFactory, area: FieldFactory, bounded: boolean) {
  return buildEntry(planRegistry, '', length, area, bounded);
}

const rawLength: FieldFactory = (description) =>
  z
    .union([z.number(), measureText(true)])
    .describe(`${description} A number in the plan's units, or text with units such as 30 in, 2' 6", 762 mm.`);
const rawArea: FieldFactory = (description) =>
  z
    .union([z.number(), measureText(true)])
    .describe(`${description} A number in the plan's units, or text with units such as 60 sq in, 387 cm².`);

/** The raw input schema: the API body, the form (zodResolver) and `GET /api/schema/plan`. */
export const planInputSchema = buildPlanSchema(rawLength, rawArea, true) as unknown as z.ZodType<RegistryInput, RegistryInput>;
export type PlanInput = z.input<typeof planInputSchema>;

/** How bare numbers in a plan are read; the plan's `units` field. */
export const unitSystemSchema = buildEntry(planRegistry.fields.units, 'units', rawLength, rawArea, true) as unknown as z.ZodType<
  UnitSystem,
  UnitSystem
>;

/** Marks issues raised while converting units, so messages can name the field. */
export const UNIT_ISSUE = 'nookpass-unit';

function converting(kind: 'length' | 'area', units: UnitSystem, bounded: boolean): FieldFactory {
  const parse = kind === 'length' ? parseLength : parseArea;
  return (description) =>
    z
      .union([z.number(), measureText(bounded)])
      .transform((value, ctx) => {
        const parsed = parse(value, units, '');
        if (parsed.ok) return parsed.value;
        ctx.issues.push({ code: 'custom', message: parsed.error.message, input: value, params: { [UNIT_ISSUE]: kind } });
        return z.NEVER;
      })
      .describe(description);
}

type CanonicalPlanSchema = z.ZodType<RegistryOutput, RegistryInput>;

function canonicalSchema(units: UnitSystem, bounded: boolean): CanonicalPlanSchema {
  const object = buildPlanSchema(converting('length', units, bounded), converting('area', units, bounded), bounded) as z.ZodObject;
  return object.superRefine((plan, ctx) => {
    const p = plan as unknown as RegistryOutput;
    // A list already refused for its size is not checked item by item: one error, not thousands.
    const over = (items: unknown[] | undefined, max: number) => bounded && (items?.length ?? 0) > max;
    if (over(p.doors, MAX_DOORS)) return;
    p.doors?.forEach((door, doorIndex) => {
      if (over(door.hinges, MAX_HINGES_PER_DOOR)) return;
      door.hinges?.forEach((position, hingeIndex) => {
        if (door.height !== undefined && (position <= 0 || position >= door.height)) {
          ctx.addIssue({
            code: 'custom',
            path: ['doors', doorIndex, 'hinges', hingeIndex],
            message: `Door ${doorIndex + 1} hinge ${hingeIndex + 1}: the position must lie within the door height (measured from the bottom edge).`,
          });
        }
      });
    });
    if (over(p.exhaust?.run, MAX_EXHAUST_RUN_PIECES)) return;
    p.exhaust?.run?.forEach((item, index) => {
      const isStraight = item.straight !== undefined;
      const isElbow = item.elbow !== undefined || item.fitting !== undefined;
      if (isStraight === isElbow) {
        ctx.addIssue({
          code: 'custom',
          path: ['exhaust', 'run', index],
          message: `Exhaust run item ${index + 1}: give either a straight length or an elbow (45 or 90) with its fitting kind, not both or neither.`,
        });
      } else if (isElbow && item.elbow === undefined) {
        ctx.addIssue({
          code: 'custom',
          path: ['exhaust', 'run', index, 'elbow'],
          message: `Exhaust run item ${index + 1}: give the elbow angle, 45 or 90.`,
        });
      }
    });
  }) as unknown as CanonicalPlanSchema;
}

const canonicalSchemas: Record<UnitSystem, CanonicalPlanSchema> = {
  imperial: canonicalSchema('imperial', true),
  metric: canonicalSchema('metric', true),
};
const storedSchemas: Record<UnitSystem, CanonicalPlanSchema> = {
  imperial: canonicalSchema('imperial', false),
  metric: canonicalSchema('metric', false),
};

/** The converting schema for new input, with every size limit. */
export function canonicalPlanSchema(units: UnitSystem) {
  return canonicalSchemas[units];
}

/** The converting schema for plans already stored: the same fields and checks, without the size limits. */
export function storedPlanSchema(units: UnitSystem) {
  return storedSchemas[units];
}

/** Canonical plan types: every length is a number of inches, every area square inches. */
export type Plan = z.output<CanonicalPlanSchema>;
export type Dryer = NonNullable<Plan['dryer']>;
export type Appliance = NonNullable<Plan['washer']>;
export type ApplianceClearances = NonNullable<Appliance['clearances']>;
export type Exhaust = NonNullable<Plan['exhaust']>;
export type RunItem = NonNullable<Exhaust['run']>[number];
export type FittingKind = NonNullable<RunItem['fitting']>;
export type Receptacle = NonNullable<NonNullable<Plan['electrical']>['receptacles']>[number];
export type Door = NonNullable<Plan['doors']>[number];
