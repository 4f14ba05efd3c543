import 'server-only';
import type { DB } from '@/db';
import { findCheck } from '@/db/checks';
import { findJurisdictionById } from '@/db/jurisdictions';
import { getProject } from '@/db/projects';
import { companyHasSentTo, insertSend } from '@/db/reports';
import type { AppUser } from '@/lib/domain/roles';
import { ConfirmationRequiredError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import { issueReport, publicBaseUrl, reportFilename } from '@/lib/services/reports/issue';
import { countReportSend } from '@/lib/services/reports/limits';
import { dispatchMail, queueMail } from '@/lib/services/mail/outbox';
import { assertMaySendToInspectors } from '@/lib/services/accounts/email-confirmation';
import type { SendInput } from '@/lib/domain/reports/send-schema';
import { formatDateTime } from '@/lib/domain/dates/format';
import { dispatchWebhookDeliveries, queueWebhookEvent } from '@/lib/services/webhooks/deliveries';

const sameAddress = (a: string, b: string | null) => !!b && a.trim().toLowerCase() === b.trim().toLowerCase();

async function inspectorAddress(db: DB, jurisdictionId: string): Promise<{ name: string; inspectorEmail: string | null }> {
  const jurisdiction = await findJurisdictionById(db, jurisdictionId);
  if (!jurisdiction) throw new NotFoundError('The jurisdiction of this project is missing.');
  return jurisdiction;
}

/**
 * Issues a report for the check and e-mails it. The jurisdiction's inspector address, and addresses the
 * company has sent to before, go without asking; any other address needs `confirm: true`. Only a send to
 * the inspector address puts the report in the jurisdiction's inspector queue. A check with failing findings
 * needs `confirmFailingFindings: true`, asked before the address so a send that needs both asks in a fixed
 * order. Sends count against the company's hourly limit before anything is issued. Replies go to the
 * installer who sent the report.
 */
export async function sendReport(db: DB, user: AppUser, checkId: string, input: SendInput) {
  await assertMaySendToInspectors(db, user);
  const check = await findCheck(db, user, checkId);
  if (!check) throw new NotFoundError('No such check, or its project belongs to another company.');
  const before = await getProject(db, user, check.projectId);
  const jur = await inspectorAddress(db, before.jurisdiction.id);
  const to = (input.to ?? jur.inspectorEmail ?? '').trim();
  if (!to) throw new ValidationError([{ path: 'to', message: `${jur.name} has no inspector e-mail on file; enter the address.` }]);
  const failing = check.summary.fail;
  if (failing > 0 && !input.confirmFailingFindings) {
    throw new ConfirmationRequiredError(
      'confirmFailingFindings',
      `This check has ${failing} failing finding${failing === 1 ? '' : 's'}; the inspector will see ${failing === 1 ? 'it' : 'them'} in the report. ` +
        'Fixing the plan and running a new check first is usually quicker than a correction notice. To send it as it is, send again with confirmFailingFindings: true.',
      'failing-findings',
      { failing },
    );
  }
  if (!sameAddress(to, jur.inspectorEmail) && !input.confirm && !(await companyHasSentTo(db, before.organizationId, to))) {
    throw new ConfirmationRequiredError(
      'to',
      `${to} is not ${jur.name}’s inspector address${jur.inspectorEmail ? ` (${jur.inspectorEmail})` : ''} and your company has not sent a report there before. ` +
        'Check the address; to send anyway, send again with confirm: true. Only reports sent to the inspector address reach the inspector’s queue in NookPass.',
      'unfamiliar-address',
    );
  }
  await countReportSend(before.organizationId);

  const { report, project, check: issuedCheck } = await issueReport(db, user, checkId);
  // Recorded against the jurisdiction the report was issued for, by its inspector address at this moment.
  const issuedJur = project.jurisdiction.id === before.jurisdiction.id ? jur : await inspectorAddress(db, project.jurisdiction.id);
  const toInspector = sameAddress(to, issuedJur.inspectorEmail);
  const verifyUrl = `${publicBaseUrl()}/verify/${report.code}`;
  const s = issuedCheck.summary;
  const text = [
    `${user.name} sends the NookPass check report for ${project.name}, ${project.siteAddress} (${issuedJur.name}).`,
    '',
    `Report ${report.code}: ${s.fail} fail, ${s.caution} caution, ${s.needsInfo} need information, ${s.pass} pass.`,
    `Rule set version ${issuedCheck.ruleSet.version}; plan revision ${issuedCheck.planRevision.number}.`,
    `Checked ${formatDateTime(issuedCheck.createdAt, project.jurisdiction.timeZone)}; report issued ${formatDateTime(report.createdAt, project.jurisdiction.timeZone)}.`,
    input.note ? `\nNote from the installer:\n${input.note}\n` : '',
    `Confirm the attached PDF is the one NookPass issued: ${verifyUrl}`,
    `SHA-256 of the PDF: ${report.sha256}`,
    '',
    'The locally adopted code, the AHJ and licensed trades govern; this report does not replace the inspection.',
  ].join('\n');
  const record = { reportId: report.id, projectId: project.id, jurisdictionId: project.jurisdiction.id, to, toInspector, actorId: user.id, note: input.note ?? null };
  // The send and its e-mail are recorded together and the answer comes at once; a job delivers the e-mail
  // (the report reaches the inspector's queue in NookPass whatever the mail relay does).
  const { mail, webhooks } = await db.transaction().execute(async (trx) => {
    const send = await insertSend(trx, { ...record, status: 'sent', error: null, messageId: null });
    // The company's webhook endpoints hear of the send with it, delivered by a job like the e-mail.
    const webhooks = await queueWebhookEvent(trx, project.organizationId, {
      type: 'report.sent',
      data: {
        project: { id: project.id, name: project.name },
        report: { code: report.code, verifyUrl },
        jurisdiction: { slug: project.jurisdiction.slug, name: issuedJur.name },
        toInspector,
      },
    });
    const mail = await queueMail(trx, {
      kind: 'report-send',
      to,
      replyTo: user.name ? { name: user.name, address: user.email } : user.email,
      subject: `Check report ${report.code} — ${project.name}`,
      text,
      attachments: [{ filename: reportFilename(project, report.code), objectKey: report.storageKey, contentType: 'application/pdf' }],
      reportId: report.id,
      reportSendId: send.id,
      createdBy: user.id,
    });
    return { mail, webhooks };
  });
  await dispatchMail([mail]);
  await dispatchWebhookDeliveries(webhooks);
  return { sent: true as const, to, toInspector, report: { code: report.code, sha256: report.sha256 }, mail: { id: mail.id, status: mail.status } };
}
