import { unchanged, upgradeStored, type UpgradeChain } from '@/lib/domain/history/upgrade';

/** The shape of a report row's stored JSON that this build writes and reads; bump it with every change to that shape. */
export const REPORT_SCHEMA_VERSION = 1;

export type StoredReportJson = { attachmentIds: string[] };

export const reportUpgrades: UpgradeChain = {
  what: 'Report',
  current: REPORT_SCHEMA_VERSION,
  steps: {
    // Version 0: issued before versions were recorded, in the shape that became version 1.
    0: unchanged,
  },
};

/** A stored report's JSON in today's shape. */
export function readStoredReport(stored: StoredReportJson, fromVersion: number, chain: UpgradeChain = reportUpgrades): StoredReportJson {
  return upgradeStored(stored, fromVersion, chain) as StoredReportJson;
}
