import { ruleSetParametersSchema, type RuleSetParameters } from '@/lib/domain/params/schema';

export * from '@/lib/domain/params/schema';
export { defaultParameters } from '@/lib/domain/params/defaults';

export type DeepPartial<T> = T extends Array<unknown>
  ? T
  : T extends object
    ? { [K in keyof T]?: DeepPartial<T[K]> }
    : T;

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function deepMerge(base: unknown, patch: unknown): unknown {
  if (!isPlainObject(base) || !isPlainObject(patch)) return patch === undefined ? base : patch;
  const out: Record<string, unknown> = { ...base };
  for (const [key, value] of Object.entries(patch)) out[key] = deepMerge(base[key], value);
  return out;
}

/** Applies a local amendment's parameter changes; throws a zod error naming any bad field. */
export function mergeParameters(base: RuleSetParameters, patch?: DeepPartial<RuleSetParameters>): RuleSetParameters {
  if (!patch) return base;
  return ruleSetParametersSchema.parse(deepMerge(base, patch));
}

/** Reads a value at a JSONPath-like `$.a.b` path, as json-rules-engine's params fact does. */
export function readParam(params: RuleSetParameters, path: string): unknown {
  if (!path.startsWith('$.')) return undefined;
  let value: unknown = params;
  for (const key of path.slice(2).split('.')) {
    if (!isPlainObject(value) || !(key in value)) return undefined;
    value = value[key];
  }
  return value;
}
