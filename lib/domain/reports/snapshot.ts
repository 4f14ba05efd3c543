import { z } from 'zod';

// What a report said when it was issued, stored with the report row so the verification page, its API and
// the inspector's queue show the issued values after the project is renamed, re-addressed or moved to
// another jurisdiction. Pure: no database, no server-only imports.

const count = z.number().int().min(0);

const snapshotV1 = z.object({
  schemaVersion: z.literal(1),
  project: z.object({ name: z.string(), siteAddress: z.string(), permitNumber: z.string().nullable(), isDemo: z.boolean() }),
  jurisdiction: z.object({ slug: z.string(), name: z.string() }),
  company: z.object({ name: z.string(), licenseNumber: z.string().nullable() }),
  ruleSet: z.object({ version: z.number().int() }),
  check: z.object({
    checkedAt: z.iso.datetime(),
    summary: z.object({ pass: count, fail: count, caution: count, needsInfo: count, notApplicable: count }),
    outcome: z.string(),
  }),
});

export type ReportSnapshot = z.infer<typeof snapshotV1>;
export const REPORT_SNAPSHOT_VERSION = 1;

export type SnapshotSource = {
  project: { name: string; siteAddress: string; permitNumber: string | null; isDemo: boolean };
  jurisdiction: { slug: string; name: string };
  organization: { name: string; licenseNumber: string | null };
  ruleSet: { version: number };
  check: { createdAt: Date; summary: ReportSnapshot['check']['summary']; outcome: string };
};

export function buildReportSnapshot(s: SnapshotSource): ReportSnapshot {
  return {
    schemaVersion: REPORT_SNAPSHOT_VERSION,
    project: { ...s.project },
    jurisdiction: { ...s.jurisdiction },
    company: { name: s.organization.name, licenseNumber: s.organization.licenseNumber },
    ruleSet: { version: s.ruleSet.version },
    check: { checkedAt: s.check.createdAt.toISOString(), summary: { ...s.check.summary }, outcome: s.check.outcome },
  };
}

/**
 * A stored snapshot in today's shape; null for reports issued before snapshots were kept. Later schema
 * versions get their upgrader here; a stored snapshot that fits none is an error, not a silent fallback.
 */
export function readReportSnapshot(stored: unknown): ReportSnapshot | null {
  if (stored === null || stored === undefined) return null;
  const parsed = snapshotV1.safeParse(stored);
  if (!parsed.success) throw new Error(`A stored report snapshot does not match schema version 1: ${parsed.error.issues[0]?.message}`);
  return parsed.data;
}
