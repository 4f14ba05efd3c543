import 'server-only';
import type { DB } from '@/db';
import { findCheckById } from '@/db/checks';
import { getProject } from '@/db/projects';
import { findThreadRootOfAnswerReport } from '@/db/correction-thread';
import { reportSentToJurisdiction, type IssuedReport } from '@/db/reports';
import type { AppUser } from '@/lib/domain/roles';
import { NotFoundError } from '@/lib/domain/errors';

/** A report is readable by its company and admins, and by inspectors of a jurisdiction it (or the report it answers) was sent to. */
export async function assertCanReadReport(db: DB, user: AppUser, report: IssuedReport): Promise<{ projectId: string }> {
  const check = await findCheckById(db, report.checkId);
  if (!check) throw new NotFoundError('The check of this report is missing.');
  if (user.role === 'inspector') {
    if (user.jurisdictionId && (await reportSentToJurisdiction(db, report.id, user.jurisdictionId))) return { projectId: check.projectId };
    // A report issued for an answer to corrections is read where the report it answers was sent.
    const rootId = await findThreadRootOfAnswerReport(db, report.id);
    if (user.jurisdictionId && rootId && (await reportSentToJurisdiction(db, rootId, user.jurisdictionId))) return { projectId: check.projectId };
    throw new NotFoundError('No such report for your jurisdiction.');
  }
  await getProject(db, user, check.projectId);
  return { projectId: check.projectId };
}
