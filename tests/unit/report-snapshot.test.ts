import { describe, expect, it } from 'vitest';
import { buildReportSnapshot, readReportSnapshot, REPORT_SNAPSHOT_VERSION } from '@/lib/domain/reports/snapshot';

const source = {
  project: { name: 'Hall closet (test)', siteAddress: '1 Test Row', permitNumber: null, isDemo: false },
  jurisdiction: { slug: 'demo-county', name: 'Demo County' },
  organization: { name: 'Test Co', licenseNumber: 'T-1' },
  ruleSet: { version: 3 },
  check: { createdAt: new Date('2026-12-01T10:00:00Z'), summary: { pass: 30, fail: 1, caution: 2, needsInfo: 0, notApplicable: 4 }, outcome: 'fail' },
};

describe('report snapshots', () => {
  it('record the issued values with their schema version and read back unchanged', () => {
    const snap = buildReportSnapshot(source);
    expect(snap.schemaVersion).toBe(REPORT_SNAPSHOT_VERSION);
    expect(snap).toMatchObject({ company: { name: 'Test Co', licenseNumber: 'T-1' }, check: { checkedAt: '2026-12-01T10:00:00.000Z' } });
    // Stored as jsonb and read back: the round trip through JSON changes nothing.
    expect(readReportSnapshot(JSON.parse(JSON.stringify(snap)))).toEqual(snap);
  });

  it('are absent for reports issued before they were kept, and a malformed one is an error', () => {
    expect(readReportSnapshot(null)).toBeNull();
    expect(() => readReportSnapshot({ schemaVersion: 2 })).toThrow(/schema version 1/);
    expect(() => readReportSnapshot({ ...buildReportSnapshot(source), check: { summary: {} } })).toThrow();
  });
});
