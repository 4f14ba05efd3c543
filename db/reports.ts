import { sql } from 'kysely';
import type { DB } from '@/db/index';
import { writeAudit } from '@/db/audit';
import type { ReviewOutcome } from '@/db/types';
import type { EvaluationSummary } from '@/lib/domain/engine';
import { isUuid } from '@/lib/domain/ids';
import { normalizeReportCode } from '@/lib/domain/reports/code';
import { INSPECTIONS_PAGE_SIZE, likePattern, type InspectionOutcomeFilter } from '@/lib/domain/reports/inspection-filter';
import { readReportSnapshot, type ReportSnapshot } from '@/lib/domain/reports/snapshot';
import { readStoredReport, REPORT_SCHEMA_VERSION } from '@/lib/domain/reports/stored';

export type IssuedReport = {
  id: string;
  checkId: string;
  code: string;
  sha256: string;
  byteSize: number;
  pageCount: number;
  storageKey: string;
  attachmentIds: string[];
  /** What the report said when issued; null for reports issued before snapshots were kept. */
  snapshot: ReportSnapshot | null;
  createdBy: string | null;
  createdAt: Date;
};

function reportQuery(db: DB) {
  return db.selectFrom('reports').selectAll();
}

type Row = Awaited<ReturnType<ReturnType<typeof reportQuery>['executeTakeFirstOrThrow']>>;

function toReport(r: Row): IssuedReport {
  const stored = readStoredReport({ attachmentIds: r.attachment_ids }, r.schema_version);
  return {
    id: r.id,
    checkId: r.check_id,
    code: r.code,
    sha256: r.sha256,
    byteSize: r.byte_size,
    pageCount: r.page_count,
    storageKey: r.storage_key,
    attachmentIds: stored.attachmentIds,
    snapshot: readReportSnapshot(r.snapshot),
    createdBy: r.created_by,
    createdAt: r.created_at,
  };
}

export async function insertReport(db: DB, r: Omit<IssuedReport, 'id' | 'createdAt' | 'snapshot'> & { snapshot: ReportSnapshot }): Promise<IssuedReport> {
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
        schema_version: REPORT_SCHEMA_VERSION,
        snapshot: JSON.stringify(r.snapshot),
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
  if (!isUuid(id)) return null;
  const row = await reportQuery(db).where('id', '=', id).executeTakeFirst();
  return row ? toReport(row) : null;
}

/** What the public verification page and its API may show: enough to trust the paper, nothing more. */
export type PublicReportFacts = {
  code: string;
  sha256: string;
  issuedAt: Date;
  pageCount: number;
  /** false: issued before reports kept what they said, so the details are the project as it is today. */
  asIssued: boolean;
  projectName: string;
  siteAddress: string;
  jurisdictionName: string;
  /** The project's jurisdiction's IANA zone, for showing the dates. */
  timeZone: string;
  /** The installer company and its contractor licence number, as printed on the report. */
  companyName: string;
  licenseNumber: string | null;
  ruleSetVersion: number;
  checkedAt: Date;
  summary: EvaluationSummary;
};

export async function publicReportFacts(db: DB, input: string): Promise<PublicReportFacts | null> {
  const code = normalizeReportCode(input);
  if (!code) return null;
  const row = await db
    .selectFrom('reports as r')
    .innerJoin('checks as c', 'c.id', 'r.check_id')
    .innerJoin('projects as p', 'p.id', 'c.project_id')
    .innerJoin('rule_sets as s', 's.id', 'c.rule_set_id')
    .innerJoin('jurisdictions as j', 'j.id', 'p.jurisdiction_id')
    .innerJoin('organizations as o', 'o.id', 'p.organization_id')
    .select([
      'r.code', 'r.sha256', 'r.created_at as issued_at', 'r.page_count', 'r.snapshot', 'p.name as project_name', 'p.site_address',
      'c.created_at as checked_at', 'c.summary', 's.version as rule_set_version', 'j.name as jurisdiction_name', 'j.time_zone',
      'o.name as organization_name', 'o.license_number',
    ])
    .where('r.code', '=', code)
    .executeTakeFirst();
  if (!row) return null;
  const snap = readReportSnapshot(row.snapshot);
  const common = { code: row.code, sha256: row.sha256, issuedAt: row.issued_at, pageCount: row.page_count, timeZone: row.time_zone };
  if (snap) {
    return {
      ...common,
      asIssued: true,
      projectName: snap.project.name,
      siteAddress: snap.project.siteAddress,
      jurisdictionName: snap.jurisdiction.name,
      companyName: snap.company.name,
      licenseNumber: snap.company.licenseNumber,
      ruleSetVersion: snap.ruleSet.version,
      checkedAt: new Date(snap.check.checkedAt),
      summary: snap.check.summary,
    };
  }
  return {
    ...common,
    asIssued: false,
    projectName: row.project_name,
    siteAddress: row.site_address,
    jurisdictionName: row.jurisdiction_name,
    companyName: row.organization_name,
    licenseNumber: row.license_number,
    ruleSetVersion: row.rule_set_version,
    checkedAt: row.checked_at,
    summary: row.summary as EvaluationSummary,
  };
}

/**
 * Whether a send went to its jurisdiction's inspector address: as recorded, or, for sends recorded before
 * that was kept (NULL), by today's inspector address. `sends` and `jurisdictions` are the query's aliases of
 * report_sends and of the jurisdiction joined on its jurisdiction_id.
 */
export function receivedByInspector(sends: string, jurisdictions: string) {
  return sql<boolean>`coalesce(${sql.ref(`${sends}.to_inspector`)}, lower(${sql.ref(`${sends}.to_email`)}) = lower(${sql.ref(`${jurisdictions}.inspector_email`)}), false)`;
}

/** Has the company sent a report to this address before (so sending there again needs no confirmation)? */
export async function companyHasSentTo(db: DB, organizationId: string, email: string): Promise<boolean> {
  const row = await db
    .selectFrom('report_sends as s')
    .innerJoin('projects as p', 'p.id', 's.project_id')
    .select('s.id')
    .where('p.organization_id', '=', organizationId)
    .where('s.status', '=', 'sent')
    .where(sql<string>`lower(s.to_email)`, '=', email.trim().toLowerCase())
    .executeTakeFirst();
  return !!row;
}

type NewSend = { reportId: string; projectId: string; jurisdictionId: string; to: string; toInspector: boolean; status: 'sent' | 'failed'; error: string | null; messageId: string | null; actorId: string; note?: string | null };

export async function recordSend(db: DB, s: NewSend) {
  return db.transaction().execute((trx) => insertSend(trx, s));
}

/** Records a send with its audit entry; run it inside the caller's transaction. */
export async function insertSend(trx: DB, s: NewSend) {
  const row = await trx
    .insertInto('report_sends')
    .values({
      report_id: s.reportId,
      project_id: s.projectId,
      jurisdiction_id: s.jurisdictionId,
      to_email: s.to,
      to_inspector: s.toInspector,
      status: s.status,
      error: s.error,
      message_id: s.messageId,
      note: s.note?.trim() || null,
      created_by: s.actorId,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
  await writeAudit(trx, { actorUserId: s.actorId, action: `report.send.${s.status}`, entityType: 'report', entityId: s.reportId, details: { to: s.to, toInspector: s.toInspector, error: s.error } });
  return row;
}

export async function listProjectSends(db: DB, projectId: string) {
  return db
    .selectFrom('report_sends as s')
    .innerJoin('reports as r', 'r.id', 's.report_id')
    .leftJoin('users as u', 'u.id', 's.created_by')
    .select(['s.id', 's.to_email', 's.to_inspector', 's.status', 's.error', 's.created_at', 'r.code', 'r.id as report_id', 'r.check_id', 'u.name as sent_by'])
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
    .select(['v.id', 'v.outcome', 'v.comment', 'v.finding_comments', 'v.created_at', 'r.code', 'r.id as report_id', 'r.check_id', 'u.name as inspector_name'])
    .where('c.project_id', '=', projectId)
    .orderBy('v.created_at', 'desc')
    .execute();
}

export type InspectionListItem = {
  reportId: string;
  code: string;
  sentAt: Date;
  /** false: issued before reports kept what they said; name, address, permit and company are today's. */
  asIssued: boolean;
  projectName: string;
  siteAddress: string;
  permitNumber: string | null;
  organizationName: string;
  summary: EvaluationSummary;
  checkOutcome: string;
  reviewOutcome: ReviewOutcome | null;
  reviewedAt: Date | null;
  /** IANA zone of the jurisdiction the report was sent to, for showing its dates. */
  timeZone: string;
};

export type InspectionSearch = {
  /** null: every jurisdiction (administrators). */
  jurisdictionId: string | null;
  q?: string;
  outcome?: InspectionOutcomeFilter;
  /** Whole days in UTC, both ends included (YYYY-MM-DD). */
  from?: string;
  to?: string;
  page?: number;
  pageSize?: number;
};

// What the report said when issued; reports from before snapshots fall back to the project as it is today.
// A snapshot's permit number stands even when it was blank at issue.
const asIssuedName = sql<string>`coalesce(r.snapshot->'project'->>'name', p.name)`;
const asIssuedAddress = sql<string>`coalesce(r.snapshot->'project'->>'siteAddress', p.site_address)`;
const asIssuedPermit = sql<string | null>`case when r.snapshot is null then p.permit_number else r.snapshot->'project'->>'permitNumber' end`;
const asIssuedCompany = sql<string>`coalesce(r.snapshot->'company'->>'name', o.name)`;

// The newest send of each report that reached the inspector's address; copies to anyone else are not in the queue.
function newestSends(db: DB, s: InspectionSearch) {
  let sends = db
    .selectFrom('report_sends as s')
    .innerJoin('jurisdictions as sj', 'sj.id', 's.jurisdiction_id')
    .select(['s.report_id', 's.project_id', 's.created_at as sent_at', 'sj.time_zone'])
    .where('s.status', '=', 'sent')
    .where(receivedByInspector('s', 'sj'))
    .distinctOn('s.report_id')
    .orderBy('s.report_id')
    .orderBy('s.created_at', 'desc');
  if (s.jurisdictionId) sends = sends.where('s.jurisdiction_id', '=', s.jurisdictionId);
  let q = db
    .selectFrom(sends.as('ls'))
    .leftJoinLateral(
      (eb) =>
        eb.selectFrom('inspection_reviews as v').select(['v.outcome', 'v.created_at as reviewed_at']).whereRef('v.report_id', '=', 'ls.report_id').orderBy('v.created_at', 'desc').limit(1).as('lv'),
      (join) => join.onTrue(),
    );
  if (s.outcome === 'awaiting') q = q.where('lv.outcome', 'is', null);
  else if (s.outcome) q = q.where('lv.outcome', '=', s.outcome);
  if (s.from) q = q.where('ls.sent_at', '>=', new Date(`${s.from}T00:00:00Z`));
  if (s.to) q = q.where('ls.sent_at', '<', new Date(Date.parse(`${s.to}T00:00:00Z`) + 86_400_000));
  return q;
}

/*
 * The sends with their report, project, company and check. Each is looked up by its key for each send (a
 * lateral subquery with LIMIT 1 is never turned into a join), so a jurisdiction's queue reads its own rows
 * through indexes however many reports other jurisdictions hold. Every send has all four (foreign keys).
 */
function withReports(sends: ReturnType<typeof newestSends>) {
  return sends
    .innerJoinLateral(
      (eb) => eb.selectFrom('reports as r').select(['r.id', 'r.code', 'r.snapshot', 'r.check_id']).whereRef('r.id', '=', 'ls.report_id').limit(1).as('r'),
      (join) => join.onTrue(),
    )
    .innerJoinLateral(
      (eb) => eb.selectFrom('projects as p').select(['p.name', 'p.site_address', 'p.permit_number', 'p.organization_id']).whereRef('p.id', '=', 'ls.project_id').limit(1).as('p'),
      (join) => join.onTrue(),
    )
    .innerJoinLateral(
      (eb) => eb.selectFrom('organizations as o').select(['o.name']).whereRef('o.id', '=', 'p.organization_id').limit(1).as('o'),
      (join) => join.onTrue(),
    )
    .innerJoinLateral(
      (eb) => eb.selectFrom('checks as c').select(['c.summary', 'c.outcome']).whereRef('c.id', '=', 'r.check_id').limit(1).as('c'),
      (join) => join.onTrue(),
    );
}

function inspectionQuery(db: DB, s: InspectionSearch) {
  let q = withReports(newestSends(db, s));
  if (s.q) {
    const pattern = likePattern(s.q);
    // Codes are read out and retyped with spaces or without dashes.
    const codeSymbols = s.q.replace(/[\s\u2010-\u2015-]+/g, '');
    q = q.where((eb) =>
      eb.or([
        eb('r.code', 'ilike', pattern),
        eb(asIssuedName, 'ilike', pattern),
        eb(asIssuedAddress, 'ilike', pattern),
        eb(asIssuedPermit, 'ilike', pattern),
        eb(asIssuedCompany, 'ilike', pattern),
        ...(codeSymbols ? [eb(sql<string>`replace(r.code, '-', '')`, 'ilike', likePattern(codeSymbols))] : []),
      ]),
    );
  }
  return q;
}

/** Reports sent to a jurisdiction's inspectors, newest send first, with their latest outcome, as they were issued; one page. */
export async function searchInspections(db: DB, s: InspectionSearch): Promise<{ items: InspectionListItem[]; total: number; page: number; pageSize: number }> {
  const pageSize = Math.min(Math.max(s.pageSize ?? INSPECTIONS_PAGE_SIZE, 1), 100);
  const page = Math.max(s.page ?? 1, 1);
  // Without a search the count needs no report, project or company: every send has them.
  const counted = s.q ? inspectionQuery(db, s) : newestSends(db, s);
  const [rows, count] = await Promise.all([
    inspectionQuery(db, s)
      .select([
        'r.id as report_id', 'r.code', 'r.snapshot', 'ls.sent_at', 'c.summary', 'c.outcome as check_outcome', 'lv.outcome as review_outcome', 'lv.reviewed_at', 'ls.time_zone',
        asIssuedName.as('project_name'), asIssuedAddress.as('site_address'), asIssuedPermit.as('permit_number'), asIssuedCompany.as('organization_name'),
      ])
      .orderBy('ls.sent_at', 'desc')
      .orderBy('r.id')
      .limit(pageSize)
      .offset((page - 1) * pageSize)
      .execute(),
    counted.select((eb) => eb.fn.countAll<string>().as('n')).executeTakeFirstOrThrow(),
  ]);
  const items = rows.map((r): InspectionListItem => {
    const snap = readReportSnapshot(r.snapshot);
    return {
      reportId: r.report_id,
      code: r.code,
      sentAt: r.sent_at,
      asIssued: !!snap,
      projectName: r.project_name,
      siteAddress: r.site_address,
      permitNumber: r.permit_number,
      organizationName: r.organization_name,
      summary: snap?.check.summary ?? (r.summary as EvaluationSummary),
      checkOutcome: snap?.check.outcome ?? r.check_outcome,
      reviewOutcome: r.review_outcome ?? null,
      reviewedAt: r.reviewed_at ?? null,
      timeZone: r.time_zone,
    };
  });
  return { items, total: Number(count.n), page, pageSize };
}

/** Did the report reach this jurisdiction's inspector address (and so its inspectors)? */
export async function reportSentToJurisdiction(db: DB, reportId: string, jurisdictionId: string): Promise<boolean> {
  const row = await db
    .selectFrom('report_sends as s')
    .innerJoin('jurisdictions as sj', 'sj.id', 's.jurisdiction_id')
    .select('s.id')
    .where('s.report_id', '=', reportId)
    .where('s.jurisdiction_id', '=', jurisdictionId)
    .where('s.status', '=', 'sent')
    .where(receivedByInspector('s', 'sj'))
    .executeTakeFirst();
  return !!row;
}

/** E-mail addresses of the people who sent this report to the inspector (they hear the outcome). */
export async function listReportSenderEmails(db: DB, reportId: string): Promise<string[]> {
  const rows = await db
    .selectFrom('report_sends as s')
    .innerJoin('users as u', 'u.id', 's.created_by')
    .select(['u.email'])
    .distinct()
    .where('s.report_id', '=', reportId)
    .where('s.status', '=', 'sent')
    .execute();
  return rows.map((r) => r.email);
}

/** The project as it is today, with its company and jurisdiction: what a report without a snapshot shows. */
export async function findReportHeading(db: DB, projectId: string) {
  const row = await db
    .selectFrom('projects as p')
    .innerJoin('organizations as o', 'o.id', 'p.organization_id')
    .innerJoin('jurisdictions as j', 'j.id', 'p.jurisdiction_id')
    .select(['p.id', 'p.name', 'p.site_address', 'p.permit_number', 'o.name as organization_name', 'o.license_number', 'j.name as jurisdiction_name', 'j.time_zone', 'p.is_demo'])
    .where('p.id', '=', projectId)
    .executeTakeFirst();
  return row
    ? { id: row.id, name: row.name, siteAddress: row.site_address, permitNumber: row.permit_number, organizationName: row.organization_name, licenseNumber: row.license_number, jurisdictionName: row.jurisdiction_name, timeZone: row.time_zone, isDemo: row.is_demo }
    : null;
}

/** The outcomes recorded on one report, newest first. */
export async function listReviewsOfReport(db: DB, reportId: string) {
  return db
    .selectFrom('inspection_reviews as v')
    .leftJoin('users as u', 'u.id', 'v.created_by')
    .select(['v.id', 'v.outcome', 'v.comment', 'v.finding_comments', 'v.created_at', 'u.name as inspector_name'])
    .where('v.report_id', '=', reportId)
    .orderBy('v.created_at', 'desc')
    .execute();
}


export type FindingCommentRow = {
  ruleKey: string;
  comment: string;
  inspectorName: string | null;
  outcome: ReviewOutcome;
  reportCode: string;
  createdAt: Date;
};

/** Every inspector's comment on a finding of this check, from the outcomes recorded on its reports, oldest first. */
export async function listFindingCommentsOfCheck(db: DB, checkId: string): Promise<FindingCommentRow[]> {
  const rows = await db
    .selectFrom('inspection_reviews as v')
    .innerJoin('reports as r', 'r.id', 'v.report_id')
    .leftJoin('users as u', 'u.id', 'v.created_by')
    .select(['v.finding_comments', 'v.outcome', 'v.created_at', 'r.code', 'u.name as inspector_name'])
    .where('r.check_id', '=', checkId)
    .orderBy('v.created_at')
    .execute();
  return rows.flatMap((r) =>
    Object.entries(r.finding_comments as Record<string, string>)
      .filter(([, comment]) => typeof comment === 'string' && comment.length > 0)
      .map(([ruleKey, comment]) => ({ ruleKey, comment, inspectorName: r.inspector_name, outcome: r.outcome, reportCode: r.code, createdAt: r.created_at })),
  );
}
