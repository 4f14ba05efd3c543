import 'server-only';
import type { DB } from '@/db';
import { insertOutcome, listThreadAnswers, listThreadOutcomes, withReportLocked } from '@/db/correction-thread';
import { listReportSenderEmails } from '@/db/reports';
import { ConflictError, ValidationError } from '@/lib/domain/errors';
import { placeOutcome } from '@/lib/domain/reports/thread';
import type { ReviewInput } from '@/lib/domain/reports/review-schema';
import type { AppUser } from '@/lib/domain/roles';
import { loadInspection } from '@/lib/services/reports/inspection';
import { publicBaseUrl } from '@/lib/services/reports/issue';
import { formatDateTime } from '@/lib/domain/dates/format';
import { dispatchMail, queueMail } from '@/lib/services/mail/outbox';
import { findProjectEventContext } from '@/db/webhooks';
import { dispatchWebhookDeliveries, queueWebhookEvent } from '@/lib/services/webhooks/deliveries';

/**
 * An inspector records an outcome on a report, or on the installer's latest answer to corrections; the
 * installers who sent it are told by e-mail, queued with the outcome (the outcome stands if mail is down). Over a standing outcome
 * only an explicit revision is recorded: a new row pointing at the one it revises.
 */
export async function recordInspectionOutcome(db: DB, user: AppUser, input: { reportId: string; review: ReviewInput }) {
  const inspection = await loadInspection(db, user, input.reportId);
  const keys = new Set(inspection.check.findings.map((f) => f.ruleKey));
  const unknown = Object.keys(input.review.findingComments).filter((k) => !keys.has(k));
  if (unknown.length) throw new ValidationError(unknown.map((k) => ({ path: `findingComments.${k}`, message: `The report has no finding ${k}.` })));
  const findingComments = Object.fromEntries(Object.entries(input.review.findingComments).filter(([, c]) => c.length > 0));
  const outcomeText = input.review.outcome === 'approved' ? 'approved' : 'corrections needed';
  const { review, mails, webhooks } = await withReportLocked(db, inspection.report.id, async (trx) => {
    const [outcomes, answers] = [await listThreadOutcomes(trx, inspection.report.id), await listThreadAnswers(trx, inspection.report.id)];
    const place = placeOutcome(outcomes, answers, { revise: input.review.revise, revises: input.review.revises }, inspection.timeZone);
    // The findings commented on are the ones under review when the page was read.
    if (place.answerId !== inspection.thread.answerId) throw new ConflictError('The installer answered the corrections meanwhile: reload the report to see the new check.');
    const review = await insertOutcome(trx, { reportId: inspection.report.id, inspectorId: user.id, outcome: input.review.outcome, comment: input.review.comment, findingComments, ...place });
    // The installers who sent the report hear about the outcome, queued with it: the outcome never waits for mail.
    const mails = [];
    for (const email of await listReportSenderEmails(trx, inspection.report.id)) {
      mails.push(
        await queueMail(trx, {
          kind: 'inspection-outcome',
          to: email,
          subject: `Inspection outcome for ${inspection.project.name}: ${outcomeText}${review.revisesId ? ' (revised)' : ''}`,
          text: [
            `${user.name} (${inspection.project.jurisdictionName}) ${review.revisesId ? 'revised the outcome to' : 'recorded'} "${outcomeText}" for report ${inspection.report.code}${review.answerId ? ', on your answer to the corrections' : ''} on ${formatDateTime(review.createdAt, inspection.timeZone)}.`,
            input.review.comment ? `\n${input.review.comment}\n` : '',
            ...Object.entries(findingComments).map(([k, c]) => `- ${inspection.check.findings.find((f) => f.ruleKey === k)?.title ?? k}: ${c}`),
            '',
            `Open the project: ${publicBaseUrl()}/projects/${inspection.project.id}`,
          ].join('\n'),
          reportId: inspection.report.id,
          reviewId: review.id,
          createdBy: user.id,
        }),
      );
    }
    // The installer company's webhook endpoints hear of it in the same transaction.
    const context = await findProjectEventContext(trx, inspection.project.id);
    const webhooks = context
      ? await queueWebhookEvent(trx, context.organizationId, {
          type: 'inspection.outcome_recorded',
          occurredAt: review.createdAt,
          data: {
            project: { id: inspection.project.id, name: context.name },
            report: { code: inspection.report.code, verifyUrl: `${publicBaseUrl()}/verify/${inspection.report.code}` },
            jurisdiction: context.jurisdiction,
            outcome: input.review.outcome,
            inspector: { name: user.name },
            revised: !!review.revisesId,
            onAnswer: !!review.answerId,
          },
        })
      : [];
    return { review, mails, webhooks };
  });
  await dispatchMail(mails);
  await dispatchWebhookDeliveries(webhooks);
  return { review, mailed: mails.length, mails: mails.map((m) => ({ id: m.id, to: m.to, status: m.status })) };
}
