import { unchanged, upgradeStored, type UpgradeChain } from '@/lib/domain/history/upgrade';

/** The shape of a rule set's parameters that this build writes and reads; bump it with every change to that shape. */
export const PARAMETERS_SCHEMA_VERSION = 3;

const EDITION = /^([A-Z][A-Za-z0-9-]*)\s+(\d{4})$/;

/*
 * Version 2 added the exhaust duct's support spacing, the terminal's opening area and the shield-plate
 * distance. Rule sets written before have no rule reading them, so the model values of their editions keep
 * their meaning (written out here as they stood, so a later change of the defaults cannot reach old rows).
 */
function addExhaustSupportTerminalAndShieldLimits(stored: unknown): unknown {
  if (typeof stored !== 'object' || stored === null) return stored;
  const params = stored as { editions?: { building?: unknown; mechanical?: unknown }; exhaust?: Record<string, unknown> };
  if (typeof params.exhaust !== 'object' || params.exhaust === null) return stored;
  const parse = (text: unknown) => (typeof text === 'string' ? EDITION.exec(text.trim()) : null);
  const building = parse(params.editions?.building);
  const code = building && building[1].toUpperCase() === 'IRC' ? building : parse(params.editions?.mechanical);
  const isIrc = code !== null && code[1].toUpperCase() === 'IRC';
  const year = code ? Number(code[2]) : 0;
  return {
    ...params,
    exhaust: {
      ...params.exhaust,
      maxSupportSpacingIn: isIrc ? (year >= 2015 ? 144 : null) : 48, // IRC M1502.4.2 (2015+); IMC 4 ft
      minTerminalOpeningSqIn: isIrc && year >= 2018 ? 12.5 : null, // IRC 2018 M1502.3
      shieldPlateMinClearanceIn: 1.25, // IRC M1502.5
    },
  };
}

export const parameterUpgrades: UpgradeChain = {
  what: 'Rule set parameters',
  current: PARAMETERS_SCHEMA_VERSION,
  steps: {
    // Version 0: saved before versions were recorded, by the schema that became version 1.
    0: unchanged,
    1: addExhaustSupportTerminalAndShieldLimits,
    // Version 3 records the local amendment's citation for each changed parameter. Older versions
    // cited none: an empty list keeps their meaning (citations change no outcome).
    2: (stored) => ({ ...(stored as Record<string, unknown>), amendments: [] }),
  },
};

/**
 * Stored parameters brought from the version they were written with to today's shape (not yet
 * validated). A parameter added since gets the value that keeps the old version's meaning.
 */
export function upgradeParameters(raw: unknown, fromVersion: number, chain: UpgradeChain = parameterUpgrades): unknown {
  return upgradeStored(raw, fromVersion, chain);
}
