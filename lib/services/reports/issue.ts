import 'server-only';
import { randomBytes } from 'node:crypto';
import type { DB } from '@/db';
import { listAttachments } from '@/db/attachments';
import { findCheck, type StoredCheck } from '@/db/checks';
import { getProject, type Project } from '@/db/projects';
import { insertReport, type IssuedReport } from '@/db/reports';
import { findRuleSetById } from '@/db/rule-sets';
import { citationCheckedDates } from '@/db/citation-checks';
import { findJurisdictionById } from '@/db/jurisdictions';
import { findOrganizationById } from '@/db/organizations';
import { findPlanRevisionSummaryById } from '@/db/plan-revisions';
import type { AppUser } from '@/lib/domain/roles';
import { NotFoundError } from '@/lib/domain/errors';
import { parseStoredPlan } from '@/lib/domain/plan';
import { putObject } from '@/lib/platform/storage';
import { reportImageFor } from '@/lib/services/attachments/derivatives';
import type { ReportData } from '@/lib/domain/reports/report-data';
import { newReportCode } from '@/lib/domain/reports/code';
import { buildReportSnapshot } from '@/lib/domain/reports/snapshot';
import { renderReportOffThread } from '@/lib/platform/pdf/render-pool';

export function publicBaseUrl(): string {
  return (process.env.NOOKPASS_PUBLIC_URL ?? process.env.NEXTAUTH_URL ?? 'http://127.0.0.1:3000').replace(/\/$/, '');
}

export function reportFilename(project: Pick<Project, 'name'>, code: string): string {
  const slug = project.name.normalize('NFKD').replace(/[^\w\s-]/g, '').trim().replace(/\s+/g, '-').toLowerCase().slice(0, 60) || 'project';
  return `nookpass-${slug}-${code}.pdf`;
}

async function gather(db: DB, user: AppUser, check: StoredCheck, project: Project, code: string): Promise<{ data: ReportData; attachmentIds: string[] }> {
  const [ruleSet, org, jur, revision, attachments, citationChecks] = await Promise.all([
    findRuleSetById(db, check.ruleSet.id),
    findOrganizationById(db, project.organizationId),
    findJurisdictionById(db, project.jurisdiction.id),
    findPlanRevisionSummaryById(db, check.planRevision.id),
    listAttachments(db, project.id),
    citationCheckedDates(db, check.ruleSet.id),
  ]);
  if (!ruleSet) throw new NotFoundError('The rule set of this check is missing.');
  if (!org || !jur || !revision) throw new NotFoundError('The project, jurisdiction or plan revision of this check is missing.');
  // Read as stored: a plan saved before today's list limits still gets its report, without drawings.
  const parsed = parseStoredPlan(check.inputs.plan);
  if (!parsed.ok) throw new NotFoundError('The plan stored with this check no longer parses.');
  const photos: ReportData['photos'] = [];
  for (const a of attachments.filter((x) => x.kind === 'photo')) {
    const image = await reportImageFor(a);
    photos.push({ caption: a.caption, filename: a.filename, image, width: a.width ?? 4, height: a.height ?? 3, addedAt: a.createdAt });
  }
  const data: ReportData = {
    code,
    verifyUrl: `${publicBaseUrl()}/verify/${code}`,
    generatedAt: new Date(),
    project: { name: project.name, siteAddress: project.siteAddress, permitNumber: project.permitNumber, isDemo: project.isDemo },
    organization: { name: org.name, licenseNumber: org.licenseNumber },
    jurisdiction: {
      name: jur.name,
      region: jur.region,
      editions: jur.editions,
      amendmentNotes: jur.amendmentNotes,
      timeZone: jur.timeZone,
    },
    ruleSet: { version: ruleSet.version, publishedAt: ruleSet.publishedAt, changelog: ruleSet.changelog },
    planRevision: { number: revision.number, savedBy: revision.createdBy.name, savedAt: revision.createdAt },
    check: { id: check.id, createdAt: check.createdAt, runBy: check.createdBy.name, summary: check.summary, outcome: check.outcome },
    findings: check.findings,
    plan: parsed.plan,
    drawingsWithheld: parsed.oversize.map((o) => o.message),
    parameters: ruleSet.parameters,
    citationChecks,
    photos,
    documents: attachments.filter((x) => x.kind === 'document').map((d) => ({ caption: d.caption, filename: d.filename, contentType: d.contentType, addedAt: d.createdAt })),
    preparedBy: user.name,
  };
  return { data, attachmentIds: attachments.map((a) => a.id) };
}

/** Renders a new report for a check, stores the PDF and records its code and SHA-256. */
export async function issueReport(db: DB, user: AppUser, checkId: string): Promise<{ report: IssuedReport; pdf: Buffer; project: Project; check: StoredCheck; renderMs: number }> {
  const check = await findCheck(db, user, checkId);
  if (!check) throw new NotFoundError('No such check, or its project belongs to another company.');
  const project = await getProject(db, user, check.projectId);
  const code = newReportCode(randomBytes);
  const { data, attachmentIds } = await gather(db, user, check, project, code);
  const started = performance.now();
  const { pdf, sha256, pageCount } = await renderReportOffThread(data);
  const renderMs = performance.now() - started;
  const storageKey = `reports/${project.id}/${code}.pdf`;
  // Stored before it is recorded: a recorded report always has its file.
  await putObject(storageKey, pdf, 'application/pdf');
  const report = await insertReport(db, {
    checkId: check.id,
    code,
    sha256,
    byteSize: pdf.length,
    pageCount,
    storageKey,
    attachmentIds,
    snapshot: buildReportSnapshot({ ...data, jurisdiction: { slug: project.jurisdiction.slug, name: data.jurisdiction.name } }),
    createdBy: user.id,
  });
  return { report, pdf, project, check, renderMs };
}
