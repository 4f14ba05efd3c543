import { upgradeStored, type UpgradeChain } from '@/lib/domain/history/upgrade';
import { planUpgrades } from '@/lib/domain/plan/upgrade';
import { splitCitationNote } from '@/lib/domain/rule-format/define';

/**
 * The shape of a check's stored JSON (inputs, facts, findings, summary) that this build writes and
 * reads. Version 1 records, in its inputs, the plan schema version of the plan it evaluated.
 */
export const CHECK_SCHEMA_VERSION = 3;

export type StoredCheckJson = {
  inputs: { plan: unknown; canonical: unknown; planSchemaVersion: number };
  facts: unknown;
  findings: unknown;
  summary: unknown;
};

export const checkUpgrades: UpgradeChain = {
  what: 'Check',
  current: CHECK_SCHEMA_VERSION,
  steps: {
    // Before versions were recorded a check held its plan revision's plan verbatim, and that plan was
    // itself written before versions were recorded: plan version 0.
    0: (stored) => {
      const check = stored as { inputs?: Record<string, unknown> };
      return { ...check, inputs: { ...check.inputs, planSchemaVersion: 0 } };
    },
    // Version 2: each finding lists the local amendments behind the values it compared. Earlier checks
    // recorded none; an empty list says so without re-evaluating anything.
    1: (stored) => {
      const check = stored as { findings?: unknown };
      const findings = Array.isArray(check.findings)
        ? check.findings.map((f) => (f && typeof f === 'object' && !('amendments' in f) ? { ...f, amendments: [] } : f))
        : check.findings;
      return { ...check, findings };
    },
    // Version 3: a note telling the rule set's admin what to fix is no longer part of an installer's
    // findings; older checks carried it in the citation note and the finding's note. The installer now
    // reads what it means on the job instead.
    2: (stored) => {
      const check = stored as { findings?: unknown };
      const findings = Array.isArray(check.findings)
        ? check.findings.map((f) => {
            if (!f || typeof f !== 'object') return f;
            const finding = { ...(f as Record<string, unknown>) };
            for (const key of ['citationNote', 'note']) {
              if (typeof finding[key] === 'string') finding[key] = splitCitationNote(finding[key]).installer;
            }
            return finding;
          })
        : check.findings;
      return { ...check, findings };
    },
  },
};

/**
 * A stored check in today's shape, never re-evaluated: its findings, facts and summary as stored, and
 * the plan it evaluated brought to today's plan shape (for drawings and comparisons). The canonical
 * plan stays as stored: it is the record of what the engine saw.
 */
export function readStoredCheck(
  stored: { inputs: unknown; facts: unknown; findings: unknown; summary: unknown },
  fromVersion: number,
  chains: { check: UpgradeChain; plan: UpgradeChain } = { check: checkUpgrades, plan: planUpgrades },
): { inputs: { plan: unknown; canonical: unknown }; facts: unknown; findings: unknown; summary: unknown } {
  const check = upgradeStored(stored, fromVersion, chains.check) as StoredCheckJson;
  const { plan, canonical, planSchemaVersion } = check.inputs;
  return { ...check, inputs: { plan: upgradeStored(plan, planSchemaVersion, chains.plan), canonical } };
}
