import { normalizeReportCode } from '@/lib/report/code';
import type { DB } from './index';
import { writeAudit } from './audit';
import type { ReviewOutcome } from './types';

export type IssuedReport = {
  id: string;
  checkId: string;
  code: string;
  sha256: string;
  byteSize: number;
  pageCount: number;
  storageKey: string;
  attachmentIds: string[];
  createdBy: string | null;
  createdAt: Date;
};

function reportQuery(db: DB) {
  return db.selectFrom('reports').selectAll();
}

type Row = Awaited<ReturnType<ReturnType<typeof reportQuery>['executeTakeFirstOrThrow']>>;

function toReport(r: Row): IssuedReport {
  return {
    id: r.id,
    checkId: r.check_id,
    code: r.code,
    sha256: r.sha256,
    byteSize: r.byte_size,
    pageCount: r.page_count,
    storageKey: r.storage_key,
    attachmentIds: r.attachment_ids as string[],
    createdBy: r.created_by,
    createdAt: r.created_at,
  };
}

export async function insertReport(db: DB, r: Omit<IssuedReport, 'id' | 'createdAt'>): Promise<IssuedReport> {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .insertInto('reports')
      .values({
        check_id: r.checkId,
        code: r.code,
        sha256: r.sha256,
        byte_size: r.byteSize,
        page_count: r.pageCount,
        storage_key: r.storageKey,
        attachment_ids: JSON.stringify(r.attachmentIds),
        created_by: r.createdBy,
      })
      .returningAll()
      .executeTakeFirstOrThrow();
    await writeAudit(trx, { actorUserId: r.createdBy, action: 'report.issue', entityType: 'report', entityId: row.id, details: { code: r.code, sha256: r.sha256, checkId: r.checkId } });
    return toReport(row);
  });
}

export async function findReportByCode(db: DB, input: string): Promise<IssuedReport | null> {
  const code = normalizeReportCode(input);
  if (!code) return null;
  const row = await reportQuery(db).where('code', '=', code).executeTakeFirst();
  return row ? toReport(row) : null;
}

export async function findReportById(db: DB, id: string): Promise<IssuedReport | null> {
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  const row = await reportQuery(db).where('id', '=', id).executeTakeFirst();
  return row ? toReport(row) : null;
}

/** What the public verification page may show: enough to trust the paper, nothing more. */
export async function publicReportFacts(db: DB, input: string) {
  const code = normalizeReportCode(input);
  if (!code) return undefined;
  return db
    .selectFrom('reports as r')
    .innerJoin('checks as c', 'c.id', 'r.check_id')
    .innerJoin('projects as p', 'p.id', 'c.project_id')
    .innerJoin('rule_sets as s', 's.id', 'c.rule_set_id')
    .innerJoin('jurisdictions as j', 'j.id', 'p.jurisdiction_id')
    .select([
      'r.code', 'r.sha256', 'r.created_at as issued_at', 'r.page_count', 'p.name as project_name', 'p.site_address',
      'c.created_at as checked_at', 'c.summary', 's.version as rule_set_version', 'j.name as jurisdiction_name',
    ])
    .where('r.code', '=', code)
    .executeTakeFirst();
}

export async function recordSend(
  db: DB,
  s: { reportId: string; projectId: string; jurisdictionId: string; to: string; status: 'sent' | 'failed'; error: string | null; messageId: string | null; actorId: string },
) {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .insertInto('report_sends')
      .values({
        report_id: s.reportId,
        project_id: s.projectId,
        jurisdiction_id: s.jurisdictionId,
        to_email: s.to,
        status: s.status,
        error: s.error,
        message_id: s.messageId,
        created_by: s.actorId,
      })
      .returningAll()
      .executeTakeFirstOrThrow();
    await writeAudit(trx, { actorUserId: s.actorId, action: `report.send.${s.status}`, entityType: 'report', entityId: s.reportId, details: { to: s.to, error: s.error } });
    return row;
  });
}

export async function listProjectSends(db: DB, projectId: string) {
  return db
    .selectFrom('report_sends as s')
    .innerJoin('reports as r', 'r.id', 's.report_id')
    .leftJoin('users as u', 'u.id', 's.created_by')
    .select(['s.id', 's.to_email', 's.status', 's.error', 's.created_at', 'r.code', 'r.id as report_id', 'r.check_id', 'u.name as sent_by'])
    .where('s.project_id', '=', projectId)
    .orderBy('s.created_at', 'desc')
    .execute();
}

export async function listReviewsForProject(db: DB, projectId: string) {
  return db
    .selectFrom('inspection_reviews as v')
    .innerJoin('reports as r', 'r.id', 'v.report_id')
    .innerJoin('checks as c', 'c.id', 'r.check_id')
    .leftJoin('users as u', 'u.id', 'v.created_by')
    .select(['v.id', 'v.outcome', 'v.comment', 'v.finding_comments', 'v.created_at', 'r.code', 'r.id as report_id', 'u.name as inspector_name'])
    .where('c.project_id', '=', projectId)
    .orderBy('v.created_at', 'desc')
    .execute();
}

/** Reports sent to one jurisdiction, newest send first, with their latest review. */
export async function listInspections(db: DB, jurisdictionId: string | null) {
  let q = db
    .selectFrom('report_sends as s')
    .innerJoin('reports as r', 'r.id', 's.report_id')
    .innerJoin('projects as p', 'p.id', 's.project_id')
    .innerJoin('organizations as o', 'o.id', 'p.organization_id')
    .innerJoin('checks as c', 'c.id', 'r.check_id')
    .leftJoinLateral(
      (eb) =>
        eb.selectFrom('inspection_reviews as v').select(['v.outcome', 'v.created_at as reviewed_at']).whereRef('v.report_id', '=', 'r.id').orderBy('v.created_at', 'desc').limit(1).as('lv'),
      (join) => join.onTrue(),
    )
    .select([
      'r.id as report_id', 'r.code', 's.created_at as sent_at', 'p.name as project_name', 'p.site_address', 'o.name as organization_name',
      'c.summary', 'c.outcome as check_outcome', 'lv.outcome as review_outcome', 'lv.reviewed_at',
    ])
    .where('s.status', '=', 'sent')
    .distinctOn('r.id')
    .orderBy('r.id')
    .orderBy('s.created_at', 'desc');
  if (jurisdictionId) q = q.where('s.jurisdiction_id', '=', jurisdictionId);
  const rows = await q.execute();
  return rows.sort((a, b) => +new Date(b.sent_at) - +new Date(a.sent_at));
}

export async function reportSentToJurisdiction(db: DB, reportId: string, jurisdictionId: string): Promise<boolean> {
  const row = await db.selectFrom('report_sends').select('id').where('report_id', '=', reportId).where('jurisdiction_id', '=', jurisdictionId).where('status', '=', 'sent').executeTakeFirst();
  return !!row;
}

export async function insertReview(
  db: DB,
  r: { reportId: string; inspectorId: string; outcome: ReviewOutcome; comment: string; findingComments: Record<string, string> },
) {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .insertInto('inspection_reviews')
      .values({ report_id: r.reportId, created_by: r.inspectorId, outcome: r.outcome, comment: r.comment, finding_comments: JSON.stringify(r.findingComments) })
      .returningAll()
      .executeTakeFirstOrThrow();
    await writeAudit(trx, { actorUserId: r.inspectorId, action: `review.${r.outcome}`, entityType: 'report', entityId: r.reportId, details: { comment: r.comment } });
    return row;
  });
}
