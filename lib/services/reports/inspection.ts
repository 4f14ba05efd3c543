import 'server-only';
import type { DB } from '@/db';
import { listAttachments } from '@/db/attachments';
import { findCheckById } from '@/db/checks';
import { citationCheckedDates } from '@/db/citation-checks';
import { findReportById, findReportHeading, listReviewsOfReport } from '@/db/reports';
import type { AppUser } from '@/lib/domain/roles';
import { NotFoundError } from '@/lib/domain/errors';
import { assertCanReadReport } from '@/lib/services/reports/access';
import { findThreadRoot, readThread } from '@/lib/services/reports/thread';

/**
 * One report as the inspector sees it: the findings under review (the latest answer's check, or the
 * report's own), photos it included, and the thread of outcomes and answers. A report issued for an
 * answer opens as the report whose thread it answers.
 */
export async function loadInspection(db: DB, user: AppUser, reportId: string) {
  const found = await findReportById(db, reportId);
  if (!found) throw new NotFoundError('No such report for your jurisdiction.');
  const report = await findThreadRoot(db, found.id);
  const { projectId } = await assertCanReadReport(db, user, report);
  const check = await findCheckById(db, report.checkId);
  if (!check) throw new NotFoundError('The check of this report is missing.');
  const current = await findReportHeading(db, projectId);
  if (!current) throw new NotFoundError('The project of this report is missing.');
  // As issued when the report kept a snapshot; reports from before that show the project as it is today.
  const snap = report.snapshot;
  const project = snap
    ? { id: current.id, name: snap.project.name, siteAddress: snap.project.siteAddress, permitNumber: snap.project.permitNumber, organizationName: snap.company.name, licenseNumber: snap.company.licenseNumber, jurisdictionName: snap.jurisdiction.name, isDemo: snap.project.isDemo }
    : current;
  // Dates are shown on the clock of the project's jurisdiction (its zone today; the PDF kept the one it was issued in).
  const included = new Set(report.attachmentIds);
  const attachments = (await listAttachments(db, projectId)).filter((a) => included.has(a.id)).map(({ storageKey: _s, thumbnailKey: _t, ...a }) => a);
  const reviews = await listReviewsOfReport(db, report.id);
  const thread = await readThread(db, report);
  const underReview = thread.underReview;
  return {
    report: { id: report.id, code: report.code, sha256: report.sha256, createdAt: report.createdAt, pageCount: report.pageCount, asIssued: !!snap },
    project,
    timeZone: current.timeZone,
    // What the next outcome is about: after an answer, the answering check.
    check: { id: underReview.id, findings: underReview.findings, summary: underReview.summary, createdAt: underReview.createdAt },
    reportedCheck: { id: check.id, summary: check.summary, createdAt: check.createdAt },
    thread: { state: thread.state, entries: thread.entries, answerId: thread.answerId },
    // The version is published and its marks append-only, so these dates cannot move after the report.
    citationChecks: await citationCheckedDates(db, underReview.ruleSet.id),
    attachments,
    reviews,
  };
}
