import { evaluate, type Evaluation, type Finding } from '@/lib/domain/engine';
import type { Editions } from '@/lib/domain/editions';
import { parsePlan, type PlanInput } from '@/lib/domain/plan';
import { buildRuleSet, type RuleSetOverrides } from '@/rules';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';

export const EDITIONS_2018: Editions = {
  building: 'IRC 2018',
  electrical: 'NEC 2017',
  plumbing: 'IPC 2018',
  plumbingFamily: 'IPC',
  mechanical: 'IMC 2018',
  fuelGas: 'IFGC 2018',
};

export const EDITIONS_2021: Editions = {
  building: 'IRC 2021',
  electrical: 'NEC 2020',
  plumbing: 'IPC 2021',
  plumbingFamily: 'IPC',
  mechanical: 'IMC 2021',
  fuelGas: 'IFGC 2021',
};

// Plans in tests are loosely typed so a case can set any field, valid or not.
export type LoosePlan = any;

/** A copy of the passing demo plan, changed by `mutate`. */
export function variant(mutate: (plan: LoosePlan) => void = () => {}): PlanInput {
  const plan = structuredClone(hallClosetPassPlan) as LoosePlan;
  mutate(plan);
  return plan;
}

export async function check(input: unknown, editions: Editions = EDITIONS_2018, overrides?: RuleSetOverrides): Promise<Evaluation> {
  const parsed = parsePlan(input);
  if (!parsed.ok) throw new Error(`Plan did not parse: ${JSON.stringify(parsed.errors)}`);
  const ruleSet = buildRuleSet(editions, overrides);
  return evaluate({ jurisdiction: 'Testville', version: 1, ...ruleSet }, parsed.plan);
}

export function finding(evaluation: Evaluation, key: string): Finding {
  const found = evaluation.findings.find((f) => f.ruleKey === key);
  if (!found) throw new Error(`No finding for ${key}`);
  return found;
}

export async function findingFor(key: string, input: unknown, editions?: Editions, overrides?: RuleSetOverrides): Promise<Finding> {
  return finding(await check(input, editions, overrides), key);
}
