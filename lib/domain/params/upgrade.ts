import { unchanged, upgradeStored, type UpgradeChain } from '@/lib/domain/history/upgrade';

/** The shape of a rule set's parameters that this build writes and reads; bump it with every change to that shape. */
export const PARAMETERS_SCHEMA_VERSION = 2;

export const parameterUpgrades: UpgradeChain = {
  what: 'Rule set parameters',
  current: PARAMETERS_SCHEMA_VERSION,
  steps: {
    // Version 0: saved before versions were recorded, by the schema that became version 1.
    0: unchanged,
    // Version 2 records the local amendment's citation for each changed parameter. Older versions
    // cited none: an empty list keeps their meaning (citations change no outcome).
    1: (stored) => ({ ...(stored as Record<string, unknown>), amendments: [] }),
  },
};

/**
 * Stored parameters brought from the version they were written with to today's shape (not yet
 * validated). A parameter added since gets the value that keeps the old version's meaning.
 */
export function upgradeParameters(raw: unknown, fromVersion: number, chain: UpgradeChain = parameterUpgrades): unknown {
  return upgradeStored(raw, fromVersion, chain);
}
