import { getDb } from '@/db';
import { insertReview } from '@/db/reports';
import { requireUser } from '@/lib/platform/auth/session';
import { ValidationError } from '@/lib/domain/errors';
import { json, parseBody, route } from '@/lib/platform/http';
import { sendMail } from '@/lib/platform/mail';
import { loadInspection } from '@/lib/services/reports/inspection';
import { publicBaseUrl } from '@/lib/services/reports/issue';
import { reviewSchema } from '@/lib/domain/reports/review-schema';

type Ctx = { params: Promise<{ reportId: string }> };

export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['inspector']);
  const input = await parseBody(request, reviewSchema);
  const db = getDb();
  const inspection = await loadInspection(db, user, (await params).reportId);
  const keys = new Set(inspection.check.findings.map((f) => f.ruleKey));
  const unknown = Object.keys(input.findingComments).filter((k) => !keys.has(k));
  if (unknown.length) throw new ValidationError(unknown.map((k) => ({ path: `findingComments.${k}`, message: `The report has no finding ${k}.` })));
  const findingComments = Object.fromEntries(Object.entries(input.findingComments).filter(([, c]) => c.length > 0));
  const review = await insertReview(db, { reportId: inspection.report.id, inspectorId: user.id, outcome: input.outcome, comment: input.comment, findingComments });

  // The installers who sent the report hear about the outcome; the outcome is saved even if mail is down.
  const senders = await db
    .selectFrom('report_sends as s')
    .innerJoin('users as u', 'u.id', 's.created_by')
    .select(['u.email'])
    .distinct()
    .where('s.report_id', '=', inspection.report.id)
    .where('s.status', '=', 'sent')
    .execute();
  const outcomeText = input.outcome === 'approved' ? 'approved' : 'corrections needed';
  let mailed = 0;
  for (const s of senders) {
    try {
      await sendMail({
        to: s.email,
        subject: `Inspection outcome for ${inspection.project.name}: ${outcomeText}`,
        text: [
          `${user.name} (${inspection.project.jurisdictionName}) recorded "${outcomeText}" for report ${inspection.report.code}.`,
          input.comment ? `\n${input.comment}\n` : '',
          ...Object.entries(findingComments).map(([k, c]) => `- ${inspection.check.findings.find((f) => f.ruleKey === k)?.title ?? k}: ${c}`),
          '',
          `Open the project: ${publicBaseUrl()}/projects/${inspection.project.id}`,
        ].join('\n'),
      });
      mailed++;
    } catch (err) {
      console.error('[review] outcome e-mail not sent:', (err as Error).message);
    }
  }
  return json({ review, mailed }, 201);
});
