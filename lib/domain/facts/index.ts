import { z } from 'zod';
import type { Plan, PlanFieldPath } from '@/lib/domain/plan';
import type { RuleSetParameters } from '@/lib/domain/params';
import { clearanceFactDefinitions, computeClearanceFacts } from '@/lib/domain/facts/clearances';
import { FactContext, type FactDefinition, type FactKind, type FactValue } from '@/lib/domain/facts/context';
import { computeDoorHardwareFacts, doorHardwareFactDefinitions } from '@/lib/domain/facts/door-hardware';
import { computeElectricalFacts, electricalFactDefinitions } from '@/lib/domain/facts/electrical';
import { computeExhaustFacts, exhaustFactDefinitions } from '@/lib/domain/facts/exhaust';
import { computeGasFacts, gasFactDefinitions } from '@/lib/domain/facts/gas';
import { computeMakeupAirFacts, makeupAirFactDefinitions } from '@/lib/domain/facts/makeup-air';
import { computePlumbingFacts, plumbingFactDefinitions } from '@/lib/domain/facts/plumbing';
import { computeServiceFacts, serviceFactDefinitions } from '@/lib/domain/facts/service';
import { computeSpaceFacts, spaceFactDefinitions } from '@/lib/domain/facts/space';

export type { FactDefinition, FactKind, FactValue } from '@/lib/domain/facts/context';
export { nominalSizeIn } from '@/lib/domain/facts/context';
export { fittingEquivalentIn } from '@/lib/domain/facts/exhaust';
export { hingesRequired } from '@/lib/domain/facts/door-hardware';

/** Every fact a rule may name, with its kind, unit and the plan fields it is computed from. */
export const factCatalog: readonly FactDefinition[] = [
  ...exhaustFactDefinitions,
  ...makeupAirFactDefinitions,
  ...gasFactDefinitions,
  ...electricalFactDefinitions,
  ...plumbingFactDefinitions,
  ...clearanceFactDefinitions,
  ...serviceFactDefinitions,
  ...doorHardwareFactDefinitions,
  ...spaceFactDefinitions,
];

export const factsByName: ReadonlyMap<string, FactDefinition> = new Map(factCatalog.map((f) => [f.name, f]));

/** Fact values by name; null where the plan lacks an input. */
export type Facts = Record<string, FactValue>;

export interface FactsWithMissing {
  facts: Facts;
  /** For each null fact, the plan fields that are missing. */
  missing: Record<string, PlanFieldPath[]>;
}

export function computeFactsWithMissing(plan: Plan, params: RuleSetParameters): FactsWithMissing {
  const ctx = new FactContext(plan, params);
  computeExhaustFacts(ctx);
  computeMakeupAirFacts(ctx);
  computeGasFacts(ctx);
  computeElectricalFacts(ctx);
  computePlumbingFacts(ctx);
  computeClearanceFacts(ctx);
  computeServiceFacts(ctx);
  computeDoorHardwareFacts(ctx);
  computeSpaceFacts(ctx);
  return { facts: ctx.values, missing: ctx.missing };
}

/** Every quantity the rules compare, computed from the canonical plan and the rule set's parameters. */
export function computeFacts(plan: Plan, params: RuleSetParameters): Facts {
  return computeFactsWithMissing(plan, params).facts;
}

const NUMERIC_KINDS: ReadonlySet<FactKind> = new Set(['length', 'area', 'cfm', 'count', 'amps', 'volts']);

function valueSchema(definition: FactDefinition): z.ZodType<FactValue> {
  if (definition.kind === 'boolean') return z.boolean().nullable();
  if (definition.kind === 'text') {
    return (definition.values ? z.enum(definition.values as [string, ...string[]]) : z.string()).nullable();
  }
  return z.number().refine(Number.isFinite, 'must be a finite number').nullable();
}

/**
 * The facts' real types. json-rules-engine compares strings alphabetically under numeric
 * operators, so every fact is coerced to its type before a run.
 */
export const factsSchema = z
  .object(Object.fromEntries(factCatalog.map((f) => [f.name, valueSchema(f)])) as Record<string, z.ZodType<FactValue>>)
  .strict();

export function isNumericKind(kind: FactKind): boolean {
  return NUMERIC_KINDS.has(kind);
}
