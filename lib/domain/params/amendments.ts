import type { FieldError } from '@/lib/domain/errors';
import { defaultParameters } from '@/lib/domain/params/defaults';
import type { RuleSetParameters } from '@/lib/domain/params/schema';
import { sameJson } from '@/lib/domain/rule-sets/stable-json';
import { parameterLabel, parameterValueText, sameParameterValue } from '@/lib/domain/params/describe';

export { parameterLabel, parameterValueText };

/** A parameter that differs from the model value, with the local amendment that makes the change. */
export type ParameterAmendment = {
  parameter: string;
  citation: string;
  modelValue: unknown;
  value: unknown;
};

// Not thresholds: the adopted editions belong to the jurisdiction, the citations list is this
// module's own, and the two section fields are themselves citations of their policy.
const NOT_AMENDABLE = new Set(['amendments', 'plumbing.drainPanSection', 'plumbing.leakShutoffSection']);

// A policy whose amendment already names its section in a parameter of its own.
const SECTION_PARAMETER: Record<string, keyof RuleSetParameters['plumbing']> = {
  'plumbing.drainPanPolicy': 'drainPanSection',
  'plumbing.leakShutoffPolicy': 'leakShutoffSection',
};

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Every amendable parameter as a dotted path with its value; lists (the hinge chart) are one value. */
function leaves(value: unknown, base = ''): [string, unknown][] {
  if (!isPlainObject(value)) return [[base, value]];
  return Object.entries(value).flatMap(([key, child]) => {
    const path = base ? `${base}.${key}` : key;
    if (path === 'editions' || NOT_AMENDABLE.has(path)) return [];
    return leaves(child, path);
  });
}

export const amendableParameters: readonly string[] = leaves(defaultParameters({
  building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021',
})).map(([path]) => path);

function readPath(value: unknown, path: string): unknown {
  let current = value;
  for (const key of path.split('.')) current = isPlainObject(current) ? current[key] : undefined;
  return current;
}

/** The model value of each parameter for the adopted editions, or null when the editions cannot be read. */
function modelParameters(params: RuleSetParameters): RuleSetParameters | null {
  try {
    return defaultParameters(params.editions);
  } catch {
    return null;
  }
}

function citationFor(params: RuleSetParameters, path: string): string | null {
  const entry = (params.amendments ?? []).find((a) => a.parameter === path && a.citation.trim() !== '');
  if (entry) return entry.citation.trim();
  const sectionKey = SECTION_PARAMETER[path];
  const section = sectionKey ? params.plumbing[sectionKey] : null;
  return typeof section === 'string' && section.trim() !== '' ? section.trim() : null;
}

/**
 * The parameters that differ from the model codes' value for the adopted editions, each with the
 * local amendment's citation (null where none is recorded).
 */
export function changedParameters(params: RuleSetParameters): (Omit<ParameterAmendment, 'citation'> & { citation: string | null })[] {
  const model = modelParameters(params);
  if (!model) return [];
  return leaves(params)
    .filter(([path, value]) => !sameParameterValue(value, readPath(model, path)))
    .map(([path, value]) => ({ parameter: path, value, modelValue: readPath(model, path), citation: citationFor(params, path) }));
}

/**
 * Why a draft's parameters cannot be saved as they are: a changed model value with no local
 * amendment cited (named by the parameter's own path), or an amendment entry naming no parameter.
 */
export function amendmentErrors(params: RuleSetParameters, prefix = 'parameters'): FieldError[] {
  const errors: FieldError[] = [];
  const seen = new Set<string>();
  (params.amendments ?? []).forEach((a, i) => {
    if (!amendableParameters.includes(a.parameter)) {
      errors.push({ path: `${prefix}.amendments.${i}.parameter`, message: `'${a.parameter}' is not a parameter a local amendment can change; name one such as exhaust.maxDevelopedLengthIn.` });
    } else if (seen.has(a.parameter)) {
      errors.push({ path: `${prefix}.amendments.${i}.parameter`, message: `${parameterLabel(a.parameter)} already has an amendment citation; keep one.` });
    }
    seen.add(a.parameter);
  });
  for (const change of changedParameters(params)) {
    if (change.citation) continue;
    errors.push({
      path: `${prefix}.${change.parameter}`,
      message:
        `${parameterLabel(change.parameter)}: changed from the model value ${parameterValueText(change.parameter, change.modelValue)} to ` +
        `${parameterValueText(change.parameter, change.value)}. Cite the local amendment that makes this change (the ordinance or amendment section).`,
    });
  }
  return errors;
}

/** The `params` paths a rule's conditions, applicability or limit read (`$.exhaust.x` → `exhaust.x`). */
export function parametersRead(...parts: unknown[]): string[] {
  const found = new Set<string>();
  const walk = (node: unknown) => {
    if (Array.isArray(node)) node.forEach(walk);
    else if (isPlainObject(node)) {
      if (node.fact === 'params' && typeof node.path === 'string' && node.path.startsWith('$.')) found.add(node.path.slice(2));
      Object.values(node).forEach(walk);
    }
  };
  parts.forEach(walk);
  return [...found];
}

/** The cited amendments behind the parameters one rule reads: what its finding cites beside the model section. */
export function amendmentsForRule(rule: { conditions: unknown; applicability: unknown; limit: unknown }, params: RuleSetParameters): ParameterAmendment[] {
  const read = new Set(parametersRead(rule.conditions, rule.applicability, rule.limit));
  if (read.size === 0) return [];
  return changedParameters(params)
    .filter((c): c is ParameterAmendment => read.has(c.parameter) && c.citation !== null);
}

function withValue(params: RuleSetParameters, path: string, value: unknown): RuleSetParameters {
  const copy = structuredClone(params) as unknown as Record<string, unknown>;
  const keys = path.split('.');
  let node = copy;
  for (const key of keys.slice(0, -1)) node = node[key] as Record<string, unknown>;
  node[keys[keys.length - 1]] = structuredClone(value);
  return copy as unknown as RuleSetParameters;
}

/**
 * Which computed facts each cited amendment moves for this plan: the facts computed again with that
 * one parameter at its model value, compared. A rule reading such a fact (an allowed length derived
 * from the maximum, say) cites the amendment; where the plan never reaches the parameter (the maker's
 * length applies instead) it does not.
 */
export function factsMovedByAmendments(
  params: RuleSetParameters,
  facts: Record<string, unknown>,
  computeFacts: (params: RuleSetParameters) => Record<string, unknown>,
): Map<string, ParameterAmendment[]> {
  const moved = new Map<string, ParameterAmendment[]>();
  for (const change of changedParameters(params)) {
    if (change.citation === null) continue;
    const atModel = computeFacts(withValue(params, change.parameter, change.modelValue));
    for (const [fact, value] of Object.entries(facts)) {
      if (!sameJson(value ?? null, atModel[fact] ?? null)) moved.set(fact, [...(moved.get(fact) ?? []), change as ParameterAmendment]);
    }
  }
  return moved;
}

/** The amendments one finding cites: those its rule reads directly, and those that moved a fact it reads. */
export function amendmentsForFinding(direct: ParameterAmendment[], ruleFacts: string[], moved: Map<string, ParameterAmendment[]>): ParameterAmendment[] {
  const out = [...direct];
  for (const fact of ruleFacts) {
    for (const amendment of moved.get(fact) ?? []) if (!out.some((a) => a.parameter === amendment.parameter)) out.push(amendment);
  }
  return out;
}
