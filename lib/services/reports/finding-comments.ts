import 'server-only';
import type { DB } from '@/db';
import { findCheckById } from '@/db/checks';
import { listFindingCommentsOfCheck } from '@/db/reports';
import { groupFindingComments, type FindingCommentsByKey } from '@/lib/domain/reports/finding-comments';

/** The inspectors' comments on the findings of one check; the caller has already decided the reader may see the check. */
export async function findingCommentsOfCheck(db: DB, checkId: string): Promise<FindingCommentsByKey> {
  return groupFindingComments(await listFindingCommentsOfCheck(db, checkId));
}

/** The finding titles of the checks that outcomes were recorded on (check id → rule key → title), so comments name findings as people read them. */
export async function findingTitlesOfChecks(db: DB, checkIds: readonly string[]): Promise<Record<string, Record<string, string>>> {
  const checks = await Promise.all([...new Set(checkIds)].map((id) => findCheckById(db, id)));
  return Object.fromEntries(checks.filter((c) => c !== null).map((c) => [c.id, Object.fromEntries(c.findings.map((f) => [f.ruleKey, f.title]))]));
}
