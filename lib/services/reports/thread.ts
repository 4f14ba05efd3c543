import 'server-only';
import type { DB } from '@/db';
import { findCheck, findCheckById, listChecks, type StoredCheck } from '@/db/checks';
import {
  findThreadRootOfAnswerReport,
  insertAnswer,
  listInspectorAddressesOfReport,
  listThreadAnswers,
  listThreadOutcomes,
  listThreadRootsOfProject,
  listThreadSends,
  withReportLocked,
} from '@/db/correction-thread';
import { findReportByCode, findReportById, findReportHeading, type IssuedReport } from '@/db/reports';
import { compareFindings, type FindingChange } from '@/lib/domain/checks/compare';
import { ConflictError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import { isUuid } from '@/lib/domain/ids';
import { threadEntries, threadState, type AnswerInput, type ThreadAnswer, type ThreadEntry, type ThreadState } from '@/lib/domain/reports/thread';
import { diffPlans } from '@/lib/domain/revisions/change-summary';
import type { AppUser } from '@/lib/domain/roles';
import { dispatchMail, queueMail } from '@/lib/services/mail/outbox';
import { assertCanReadReport } from '@/lib/services/reports/access';
import { issueReport, publicBaseUrl, reportFilename } from '@/lib/services/reports/issue';
import { countReportSend } from '@/lib/services/reports/limits';
import { DEFAULT_TIME_ZONE, formatDateTime } from '@/lib/domain/dates/format';

/** A plan value as entered, for "from → to" lines; numbers are in the plan's own units. */
function showValue(v: unknown): string {
  if (v === undefined) return '—';
  if (v === null) return 'none';
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  if (typeof v === 'string' || typeof v === 'number') return String(v);
  return JSON.stringify(v);
}

export type PlanValueChange = { path: string; label: string; from: string; to: string };
export type AnswerWithChanges = ThreadAnswer & { changes: { findings: FindingChange[]; plan: PlanValueChange[] } };

/** What changed between the check the inspector saw and the one answering: findings by status, plan values. */
export function checkChanges(before: StoredCheck, after: StoredCheck): AnswerWithChanges['changes'] {
  return {
    findings: compareFindings(before.findings, after.findings),
    plan: diffPlans(before.inputs.plan, after.inputs.plan).map((c) => ({ path: c.path, label: c.label, from: showValue(c.from), to: showValue(c.to) })),
  };
}

export type Thread = {
  rootReport: { id: string; code: string };
  state: ThreadState;
  entries: (ThreadEntry | ({ kind: 'answer'; at: Date } & AnswerWithChanges))[];
  /** The check the standing or next outcome is about: the latest answer's, or the report's own. */
  underReview: StoredCheck;
  /** The answer under review, if any. */
  answerId: string | null;
};

/** The whole thread of a report the caller may already read. */
export async function readThread(db: DB, report: IssuedReport): Promise<Thread> {
  const [sends, outcomes, answers] = await Promise.all([listThreadSends(db, report.id), listThreadOutcomes(db, report.id), listThreadAnswers(db, report.id)]);
  const checks = await Promise.all([report.checkId, ...answers.map((a) => a.checkId)].map((id) => findCheckById(db, id)));
  if (checks.some((c) => !c)) throw new NotFoundError('A check of this report’s thread is missing.');
  const withChanges: AnswerWithChanges[] = answers.map((a, i) => ({ ...a, changes: checkChanges(checks[i]!, checks[i + 1]!) }));
  const entries = threadEntries(sends, outcomes, []).concat(withChanges.map((a) => ({ kind: 'answer' as const, at: a.createdAt, ...a })));
  entries.sort((a, b) => +a.at - +b.at);
  return {
    rootReport: { id: report.id, code: report.code },
    state: threadState(outcomes, answers),
    entries,
    underReview: checks[checks.length - 1]!,
    answerId: answers.at(-1)?.id ?? null,
  };
}

/** A report by id or code; a report issued for an answer leads to the report whose thread it answers. */
export async function findThreadRoot(db: DB, ref: string): Promise<IssuedReport> {
  const report = isUuid(ref) ? await findReportById(db, ref) : await findReportByCode(db, ref);
  if (!report) throw new NotFoundError('No such report.');
  const rootId = await findThreadRootOfAnswerReport(db, report.id);
  if (!rootId) return report;
  const root = await findReportById(db, rootId);
  if (!root) throw new NotFoundError('No such report.');
  return root;
}

/** The thread as either side reads it (installers of the company, inspectors it reached, admins). */
export async function loadThread(db: DB, user: AppUser, ref: string) {
  const report = await findThreadRoot(db, ref);
  await assertCanReadReport(db, user, report);
  const { underReview, ...thread } = await readThread(db, report);
  return { ...thread, underReview: { id: underReview.id, createdAt: underReview.createdAt, summary: underReview.summary, outcome: underReview.outcome } };
}

/**
 * The installer answers "corrections needed" with the project's latest check, newer than the one the
 * inspector saw, and a note. A report is issued for that check as when sending, the answer joins the
 * thread, and the inspector address the report reached is told (the answer stands if mail is down).
 */
export async function answerCorrections(db: DB, user: AppUser, ref: string, input: AnswerInput) {
  const report = await findThreadRoot(db, ref);
  const { projectId } = await assertCanReadReport(db, user, report);
  const before = await readThread(db, report);
  if (before.state.kind !== 'awaiting-corrections') {
    throw new ConflictError(
      before.state.kind === 'approved'
        ? `Report ${report.code} is approved; there are no corrections to answer.`
        : `Report ${report.code} is not awaiting corrections: the inspector has not recorded an outcome on ${before.answerId ? 'your latest answer' : 'it'} yet.`,
    );
  }
  const standing = before.state.current;
  const check = await findCheck(db, user, input.checkId);
  if (!check) throw new ValidationError([{ path: 'checkId', message: 'No such check in your company.' }]);
  if (check.projectId !== projectId) throw new ValidationError([{ path: 'checkId', message: 'That check belongs to another project; answer with a check of this project.' }]);
  const [latest] = await listChecks(db, user, projectId);
  if (latest && latest.id !== check.id) {
    throw new ValidationError([{ path: 'checkId', message: `Answer with the project’s latest check (run ${formatDateTime(latest.createdAt, (await findReportHeading(db, projectId))?.timeZone ?? DEFAULT_TIME_ZONE)}).` }]);
  }
  if (+check.createdAt <= +before.underReview.createdAt) {
    throw new ValidationError([{ path: 'checkId', message: 'This is the check the inspector already reviewed: correct the plan, run a new check, then answer with it.' }]);
  }
  // The answer e-mails a report like a send does, so it counts against the company's sends.
  if (user.organizationId) await countReportSend(user.organizationId);

  const issued = await issueReport(db, user, check.id);
  const { answer, mails } = await withReportLocked(db, report.id, async (trx) => {
    const outcomes = await listThreadOutcomes(trx, report.id);
    const answers = await listThreadAnswers(trx, report.id);
    const state = threadState(outcomes, answers);
    // Someone else answered, or the inspector revised, while the report was being issued.
    if (state.kind !== 'awaiting-corrections' || state.current.id !== standing.id) {
      throw new ConflictError(`Report ${report.code} changed while you answered; reload it. The report ${issued.report.code} issued for your check is kept.`);
    }
    const answer = await insertAnswer(trx, { reportId: report.id, reviewId: state.current.id, checkId: check.id, answerReportId: issued.report.id, note: input.note, installerId: user.id });
    // The inspectors' e-mails are queued with the answer; a job delivers them.
    const mails = [];
    for (const to of await listInspectorAddressesOfReport(trx, report.id)) {
      mails.push(
        await queueMail(trx, {
          kind: 'corrections-answer',
          to,
          subject: `Corrections answered: ${issued.project.name} (report ${report.code})`,
          text: [
            `${user.name} answered the corrections on report ${report.code} with a new check (run ${formatDateTime(check.createdAt, issued.project.jurisdiction.timeZone)}), report ${issued.report.code}.`,
            '',
            `Note from the installer:\n${input.note}`,
            '',
            `See what changed and record the outcome: ${publicBaseUrl()}/inspections/${report.id}`,
            `Confirm the attached PDF is the one NookPass issued: ${publicBaseUrl()}/verify/${issued.report.code}`,
            '',
            'The locally adopted code, the AHJ and licensed trades govern; this report does not replace the inspection.',
          ].join('\n'),
          attachments: [{ filename: reportFilename(issued.project, issued.report.code), objectKey: issued.report.storageKey, contentType: 'application/pdf' }],
          reportId: report.id,
          createdBy: user.id,
        }),
      );
    }
    return { answer, mails };
  });
  await dispatchMail(mails);
  return { answer: { id: answer.id, createdAt: answer.createdAt }, report: { code: issued.report.code, sha256: issued.report.sha256 }, mailed: mails.length };
}

/** Every thread of a project (one per report that reached the inspector), newest first, for its page. */
export async function loadProjectThreads(db: DB, user: AppUser, projectId: string) {
  const roots = await listThreadRootsOfProject(db, projectId);
  const out = [];
  for (const root of roots) {
    const report = await findReportById(db, root.reportId);
    if (!report) continue;
    await assertCanReadReport(db, user, report);
    const { underReview, ...thread } = await readThread(db, report);
    out.push({ ...thread, reportedCheckId: report.checkId, underReview: { id: underReview.id, createdAt: underReview.createdAt }, findingTitles: Object.fromEntries(underReview.findings.map((f) => [f.ruleKey, f.title])) });
  }
  return out;
}
