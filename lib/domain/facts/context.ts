import type { Plan, PlanFieldPath } from '@/lib/domain/plan';
import type { RuleSetParameters } from '@/lib/domain/params';

export type FactKind = 'length' | 'area' | 'cfm' | 'count' | 'amps' | 'volts' | 'boolean' | 'text';
export type FactValue = number | boolean | string | null;

export interface FactDefinition {
  name: string;
  kind: FactKind;
  description: string;
  /** Plan fields the fact is computed from (registry paths, checked by the compiler). */
  planPaths: PlanFieldPath[];
  /** For text facts, the values it can take. */
  values?: readonly string[];
}

/**
 * Sums of converted lengths pick up float noise (226.97635000000002). Only values within 1e-9 in
 * of a micro-inch are snapped, so exact metric conversions (60 mm = 2.36220472441 in) stay put.
 */
function trimNoise(value: number): number {
  const snapped = Math.round(value * 1e6) / 1e6;
  return Math.abs(snapped - value) < 1e-9 ? snapped : value;
}

/** Reads a plan value the fact needs; the path names it in the registry when it is missing. */
export type Need = <T>(path: PlanFieldPath, value: T | null | undefined) => T;

/** Collects fact values and, for each null fact, the plan fields whose absence made it null. */
export class FactContext {
  readonly values: Record<string, FactValue> = {};
  readonly missing: Record<string, PlanFieldPath[]> = {};

  constructor(
    readonly plan: Plan,
    readonly params: RuleSetParameters,
  ) {}

  private pending: PlanFieldPath[] = [];
  // One `need` per context: a closure made per fact costs more than the fact itself.
  private readonly need: Need = (path, value) => {
    if (value === undefined || value === null) this.pending.push(path);
    return value as never;
  };

  /**
   * Computes a fact. `need` records a missing plan field and lets the computation go on, so one
   * fact can name every field it lacks; any missing field makes the fact null.
   */
  fact(name: string, compute: (need: Need) => FactValue): void {
    this.pending = [];
    let value: FactValue = null;
    try {
      value = compute(this.need);
    } catch (error) {
      if (this.pending.length === 0) throw error;
    }
    const missing = this.pending;
    if (missing.length > 0) {
      this.values[name] = null;
      this.missing[name] = missing.length > 1 ? [...new Set(missing)] : missing;
    } else {
      this.values[name] = typeof value === 'number' ? trimNoise(value) : (value ?? null);
      if (value === null || value === undefined) this.missing[name] = [];
    }
  }

  /** A fact derived from other facts: null (with their missing fields) when any input is null. */
  derived(name: string, inputs: string[], compute: (...values: Array<NonNullable<FactValue>>) => FactValue): void {
    const missing = inputs.filter((input) => this.values[input] === null || this.values[input] === undefined);
    if (missing.length > 0) {
      this.values[name] = null;
      this.missing[name] = [...new Set(missing.flatMap((input) => this.missing[input] ?? []))];
      return;
    }
    const value = compute(...inputs.map((input) => this.values[input] as NonNullable<FactValue>));
    this.values[name] = typeof value === 'number' ? trimNoise(value) : value;
  }
}

const NOMINAL_PIPE_SIZES_IN = [1.25, 1.5, 2, 2.5, 3, 4, 5, 6];

/**
 * Snaps a measured or metric pipe/duct size to the nominal inch size it stands for (DN 50 ->
 * 2 in, 100 mm -> 4 in), so a metric plan is not failed for a 2 % naming difference.
 */
export function nominalSizeIn(sizeIn: number): number {
  const nearest = NOMINAL_PIPE_SIZES_IN.reduce((best, size) =>
    Math.abs(size - sizeIn) < Math.abs(best - sizeIn) ? size : best,
  );
  return Math.abs(nearest - sizeIn) <= nearest * 0.04 ? nearest : sizeIn;
}

export function define(
  name: string,
  kind: FactKind,
  description: string,
  planPaths: PlanFieldPath[],
  values?: readonly string[],
): FactDefinition {
  return values ? { name, kind, description, planPaths, values } : { name, kind, description, planPaths };
}
