import { unchanged, upgradeStored, type UpgradeChain } from '@/lib/domain/history/upgrade';
import { parsePlan } from '@/lib/domain/plan';

/** The shape of the plan as entered that this build writes and reads; bump it with every change to that shape. */
export const PLAN_SCHEMA_VERSION = 1;

export const planUpgrades: UpgradeChain = {
  what: 'Plan',
  current: PLAN_SCHEMA_VERSION,
  steps: {
    // Version 0: saved before versions were recorded, by the schema that became version 1.
    0: unchanged,
  },
};

/** A stored plan as entered, brought from the version it was written with to today's shape (not yet validated). */
export function upgradePlan(raw: unknown, fromVersion: number, chain: UpgradeChain = planUpgrades): unknown {
  return upgradeStored(raw, fromVersion, chain);
}

/**
 * A stored plan revision in today's shape. The canonical form is derived data: kept as stored when it
 * was written in today's shape, else derived again from the upgraded plan (null if that no longer parses).
 */
export function readStoredPlan(
  stored: { plan: unknown; canonical: unknown },
  fromVersion: number,
  chain: UpgradeChain = planUpgrades,
): { plan: unknown; canonical: unknown } {
  const plan = upgradePlan(stored.plan, fromVersion, chain);
  if (fromVersion === chain.current) return { plan, canonical: stored.canonical };
  const parsed = parsePlan(plan);
  return { plan, canonical: parsed.ok ? parsed.plan : null };
}
