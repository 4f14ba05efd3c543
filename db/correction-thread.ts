import type { DB } from '@/db/index';
import { writeAudit } from '@/db/audit';
import { receivedByInspector } from '@/db/reports';
import type { ReviewOutcome } from '@/db/types';
import type { ThreadAnswer, ThreadEntry, ThreadOutcome } from '@/lib/domain/reports/thread';

/**
 * Runs `fn` in one transaction holding the report's row lock, so two people recording on the same report
 * decide one after the other (the second sees the first's outcome or answer).
 */
export async function withReportLocked<T>(db: DB, reportId: string, fn: (trx: DB) => Promise<T>): Promise<T> {
  return db.transaction().execute(async (trx) => {
    await trx.selectFrom('reports').select('id').where('id', '=', reportId).forUpdate().executeTakeFirstOrThrow();
    return fn(trx);
  });
}

/** Every outcome recorded on the report, oldest first. */
export async function listThreadOutcomes(db: DB, reportId: string): Promise<ThreadOutcome[]> {
  const rows = await db
    .selectFrom('inspection_reviews as v')
    .leftJoin('users as u', 'u.id', 'v.created_by')
    .select(['v.id', 'v.outcome', 'v.comment', 'v.finding_comments', 'v.revises_id', 'v.answer_id', 'v.created_at', 'u.name as inspector_name'])
    .where('v.report_id', '=', reportId)
    .orderBy('v.created_at', 'asc')
    .execute();
  return rows.map((r) => ({
    id: r.id,
    outcome: r.outcome,
    comment: r.comment,
    findingComments: (r.finding_comments ?? {}) as Record<string, string>,
    revisesId: r.revises_id,
    answerId: r.answer_id,
    inspectorName: r.inspector_name,
    createdAt: r.created_at,
  }));
}

/** The installer's answers on the report, oldest first, with the code of the report issued for each. */
export async function listThreadAnswers(db: DB, reportId: string): Promise<ThreadAnswer[]> {
  const rows = await db
    .selectFrom('correction_answers as a')
    .innerJoin('reports as r', 'r.id', 'a.answer_report_id')
    .leftJoin('users as u', 'u.id', 'a.created_by')
    .select(['a.id', 'a.review_id', 'a.check_id', 'a.answer_report_id', 'r.code', 'a.note', 'a.created_at', 'u.name as installer_name'])
    .where('a.report_id', '=', reportId)
    .orderBy('a.created_at', 'asc')
    .execute();
  return rows.map((r) => ({
    id: r.id,
    reviewId: r.review_id,
    checkId: r.check_id,
    reportId: r.answer_report_id,
    reportCode: r.code,
    note: r.note,
    installerName: r.installer_name,
    createdAt: r.created_at,
  }));
}

/** The sends of the report that reached its jurisdiction's inspector, with the installer's note. */
export async function listThreadSends(db: DB, reportId: string): Promise<Extract<ThreadEntry, { kind: 'sent' }>[]> {
  const rows = await db
    .selectFrom('report_sends as s')
    .innerJoin('jurisdictions as sj', 'sj.id', 's.jurisdiction_id')
    .innerJoin('reports as r', 'r.id', 's.report_id')
    .leftJoin('users as u', 'u.id', 's.created_by')
    .select(['s.created_at', 's.to_email', 's.note', 'r.code', 'u.name as sent_by'])
    .where('s.report_id', '=', reportId)
    .where('s.status', '=', 'sent')
    .where(receivedByInspector('s', 'sj'))
    .orderBy('s.created_at', 'asc')
    .execute();
  return rows.map((r) => ({ kind: 'sent', at: r.created_at, by: r.sent_by, to: r.to_email, note: r.note, reportCode: r.code }));
}

/** The report whose thread this report answers, if it was issued for an answer. */
export async function findThreadRootOfAnswerReport(db: DB, answerReportId: string): Promise<string | null> {
  const row = await db.selectFrom('correction_answers').select('report_id').where('answer_report_id', '=', answerReportId).executeTakeFirst();
  return row?.report_id ?? null;
}

/** Reports of a project that reached the inspector and are not themselves answers: each heads a thread. */
export async function listThreadRootsOfProject(db: DB, projectId: string): Promise<{ reportId: string; code: string }[]> {
  const rows = await db
    .selectFrom('report_sends as s')
    .innerJoin('jurisdictions as sj', 'sj.id', 's.jurisdiction_id')
    .innerJoin('reports as r', 'r.id', 's.report_id')
    .select(['r.id', 'r.code'])
    .select((eb) => eb.fn.min('s.created_at').as('first_sent'))
    .where('s.project_id', '=', projectId)
    .where('s.status', '=', 'sent')
    .where(receivedByInspector('s', 'sj'))
    .where((eb) => eb.not(eb.exists(eb.selectFrom('correction_answers as a').select('a.id').whereRef('a.answer_report_id', '=', 'r.id'))))
    .groupBy(['r.id', 'r.code'])
    .orderBy('first_sent', 'desc')
    .execute();
  return rows.map((r) => ({ reportId: r.id, code: r.code }));
}

export async function insertOutcome(
  db: DB,
  r: { reportId: string; inspectorId: string; outcome: ReviewOutcome; comment: string; findingComments: Record<string, string>; revisesId: string | null; answerId: string | null },
) {
  const row = await db
    .insertInto('inspection_reviews')
    .values({
      report_id: r.reportId,
      created_by: r.inspectorId,
      outcome: r.outcome,
      comment: r.comment,
      finding_comments: JSON.stringify(r.findingComments),
      revises_id: r.revisesId,
      answer_id: r.answerId,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
  await writeAudit(db, {
    actorUserId: r.inspectorId,
    action: r.revisesId ? `review.revise.${r.outcome}` : `review.${r.outcome}`,
    entityType: 'report',
    entityId: r.reportId,
    details: { comment: r.comment, revises: r.revisesId, answer: r.answerId },
  });
  return { id: row.id, outcome: row.outcome, comment: row.comment, revisesId: row.revises_id, answerId: row.answer_id, createdAt: row.created_at };
}

export async function insertAnswer(db: DB, a: { reportId: string; reviewId: string; checkId: string; answerReportId: string; note: string; installerId: string }) {
  const row = await db
    .insertInto('correction_answers')
    .values({ report_id: a.reportId, review_id: a.reviewId, check_id: a.checkId, answer_report_id: a.answerReportId, note: a.note, created_by: a.installerId })
    .returningAll()
    .executeTakeFirstOrThrow();
  await writeAudit(db, { actorUserId: a.installerId, action: 'report.answer', entityType: 'report', entityId: a.reportId, details: { checkId: a.checkId, answerReportId: a.answerReportId } });
  return { id: row.id, createdAt: row.created_at };
}

/** Addresses of the jurisdiction's inspector the report reached: they hear of the answer. */
export async function listInspectorAddressesOfReport(db: DB, reportId: string): Promise<string[]> {
  const rows = await db
    .selectFrom('report_sends as s')
    .innerJoin('jurisdictions as sj', 'sj.id', 's.jurisdiction_id')
    .select('s.to_email')
    .distinct()
    .where('s.report_id', '=', reportId)
    .where('s.status', '=', 'sent')
    .where(receivedByInspector('s', 'sj'))
    .execute();
  return rows.map((r) => r.to_email);
}
