import { z } from 'zod';
import { getDb } from '@/db';
import { recordSend } from '@/db/reports';
import { requireUser } from '@/lib/platform/auth/session';
import { ServiceUnavailableError, ValidationError } from '@/lib/domain/errors';
import { json, parseBody, route } from '@/lib/platform/http';
import { sendMail } from '@/lib/platform/mail';
import { issueReport, publicBaseUrl, reportFilename } from '@/lib/services/reports/issue';

type Ctx = { params: Promise<{ id: string }> };

const sendSchema = z.strictObject({
  to: z.email('Give the inspector’s e-mail address.').optional().describe('Defaults to the jurisdiction’s inspector e-mail.'),
  note: z.string().max(2000, 'Keep the note under 2000 characters.').optional(),
});

export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const body = await parseBody(request, sendSchema);
  const db = getDb();
  const { report, pdf, project, check } = await issueReport(db, user, (await params).id);
  const jur = await db.selectFrom('jurisdictions').select(['inspector_email', 'name']).where('id', '=', project.jurisdiction.id).executeTakeFirstOrThrow();
  const to = body.to ?? jur.inspector_email;
  if (!to) throw new ValidationError([{ path: 'to', message: `${jur.name} has no inspector e-mail on file; enter the address.` }]);
  const verifyUrl = `${publicBaseUrl()}/verify/${report.code}`;
  const s = check.summary;
  const text = [
    `${user.name} sends the NookPass check report for ${project.name}, ${project.siteAddress} (${jur.name}).`,
    '',
    `Report ${report.code}: ${s.fail} fail, ${s.caution} caution, ${s.needsInfo} need information, ${s.pass} pass.`,
    `Rule set version ${check.ruleSet.version}; plan revision ${check.planRevision.number}.`,
    body.note ? `\nNote from the installer:\n${body.note}\n` : '',
    `Confirm the attached PDF is the one NookPass issued: ${verifyUrl}`,
    `SHA-256 of the PDF: ${report.sha256}`,
    '',
    'The locally adopted code, the AHJ and licensed trades govern; this report does not replace the inspection.',
  ].join('\n');
  try {
    const { messageId } = await sendMail({
      to,
      subject: `Check report ${report.code} — ${project.name}`,
      text,
      attachments: [{ filename: reportFilename(project, report.code), content: pdf, contentType: 'application/pdf' }],
    });
    await recordSend(db, { reportId: report.id, projectId: project.id, jurisdictionId: project.jurisdiction.id, to, status: 'sent', error: null, messageId, actorId: user.id });
    return json({ sent: true, to, report: { code: report.code, sha256: report.sha256 } }, 201);
  } catch (err) {
    if (!(err instanceof ServiceUnavailableError) && !(err instanceof ValidationError)) throw err;
    // The report stays issued and the failure is on record; sending again later works.
    await recordSend(db, { reportId: report.id, projectId: project.id, jurisdictionId: project.jurisdiction.id, to, status: 'failed', error: err.message, messageId: null, actorId: user.id });
    throw err;
  }
});
