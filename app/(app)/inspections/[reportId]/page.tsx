import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db';
import { FindingsList } from '@/components/checks/findings-list';
import { SummaryCounts } from '@/components/checks/summary-counts';
import { OutcomePanel } from '@/components/reports/outcome-panel';
import { ThreadSection } from '@/components/reports/thread-section';
import { PageHeader } from '@/components/ui/page-header';
import { SafetyNotice } from '@/components/ui/safety-notice';
import { requirePageUser } from '@/lib/platform/auth/session';
import { NotFoundError } from '@/lib/domain/errors';
import { loadInspection } from '@/lib/services/reports/inspection';
import { findingCommentsOfCheck } from '@/lib/services/reports/finding-comments';
import { formatDateTime } from '@/lib/domain/dates/format';
import { listMailOfReadableReports } from '@/lib/services/mail/outbox';
import { MailDelivery } from '@/components/mail/mail-delivery';
import { mailDeliveryProps } from '@/lib/domain/mail/outbox';
import { ThumbnailState } from '@/components/attachments/thumbnail-state';

export const metadata: Metadata = { title: 'Inspection' };

export default async function InspectionPage({ params }: { params: Promise<{ reportId: string }> }) {
  const { reportId } = await params;
  const user = await requirePageUser(['inspector', 'admin'], `/inspections/${reportId}`);
  let data;
  try {
    data = await loadInspection(getDb(), user, reportId);
  } catch (err) {
    if (err instanceof NotFoundError) notFound();
    throw err;
  }
  const { report, project, check, attachments, thread, citationChecks, timeZone } = data;
  const standing = thread.state.kind === 'awaiting-outcome' ? null : thread.state.current;
  // The installer's latest word: the note of the latest answer, or the one sent with the report.
  const lastNote = [...thread.entries].reverse().find((e) => (e.kind === 'answer' || e.kind === 'sent') && e.note);
  const installerNote = lastNote && (lastNote.kind === 'answer' ? { text: lastNote.note, by: lastNote.installerName } : lastNote.kind === 'sent' && lastNote.note ? { text: lastNote.note, by: lastNote.by } : null);
  const findingTitles = Object.fromEntries(check.findings.map((f) => [f.ruleKey, f.title]));
  const comments = await findingCommentsOfCheck(getDb(), check.id);
  const outcomeMails = (await listMailOfReadableReports(getDb(), [report.id])).filter((m) => m.kind === 'inspection-outcome');
  return (
    <>
      <PageHeader kicker={`${project.jurisdictionName} · report ${report.code}`} title={project.name}>
        <a className="btn-secondary" href={`/api/reports/${report.code}/pdf`}>Download the issued PDF</a>
        <Link className="btn-secondary" href={`/verify/${report.code}`}>Verification page</Link>
      </PageHeader>
      <p className="-mt-4 mb-4 text-sm text-ink-soft">
        {project.siteAddress} · {project.organizationName}{project.licenseNumber ? `, licence ${project.licenseNumber}` : ''}{project.permitNumber ? ` · permit ${project.permitNumber}` : ''}
      </p>
      {!report.asIssued && (
        <p className="mb-4 text-sm text-ink-soft">
          Issued before NookPass recorded what each report said: the project details above are as they are today. The
          issued PDF is the record of what the report said.
        </p>
      )}
      {thread.answerId && (
        <p className="mb-2 text-sm font-semibold" data-testid="under-review">
          Findings of the installer’s answering check of {formatDateTime(check.createdAt, timeZone)}; the report as first sent is {report.code}.
        </p>
      )}
      <SummaryCounts summary={check.summary} />
      <div className="mt-4"><SafetyNotice compact /></div>
      <div className="mt-6 grid gap-6 lg:grid-cols-[2fr_1fr]">
        <section aria-label="Findings"><FindingsList findings={check.findings} citationChecks={citationChecks} comments={comments} timeZone={timeZone} /></section>
        <aside className="space-y-6">
          {user.role === 'inspector' && (
            <OutcomePanel
              reportId={report.id}
              findings={check.findings.map((f) => ({ ruleKey: f.ruleKey, title: f.title, status: f.status }))}
              standing={standing && { id: standing.id, outcome: standing.outcome, comment: standing.comment, findingComments: standing.findingComments, inspectorName: standing.inspectorName, createdAt: standing.createdAt.toISOString() }}
              installerNote={installerNote || null}
              onAnswer={!!thread.answerId}
              timeZone={timeZone}
            />
          )}
          <ThreadSection entries={thread.entries} findingTitles={findingTitles} headingId="thread-h" timeZone={timeZone} />
          {outcomeMails.length > 0 && (
            <section className="card p-5 text-sm" aria-labelledby="outcome-mail-h">
              <h2 id="outcome-mail-h" className="font-bold">Outcome e-mails to the installer</h2>
              <ul className="mt-2 space-y-2" data-testid="outcome-mails">
                {outcomeMails.map((m) => (
                  <li key={m.id}>
                    <span className="block text-ink-soft">{m.to} · {formatDateTime(m.createdAt, timeZone)}</span>
                    <MailDelivery initial={mailDeliveryProps(m)} />
                  </li>
                ))}
              </ul>
            </section>
          )}
          {attachments.length > 0 && (
            <section className="card p-5 text-sm" aria-labelledby="att-h">
              <h2 id="att-h" className="font-bold">Photos and documents in the report</h2>
              <ul className="mt-2 grid grid-cols-2 gap-3">
                {attachments.map((a) => (
                  <li key={a.id}>
                    {a.kind === 'photo' && a.derivatives.status !== 'ready' ? (
                      <ThumbnailState derivatives={a.derivatives} filename={a.filename} />
                    ) : a.kind === 'photo' ? (
                      // eslint-disable-next-line @next/next/no-img-element
                      <img src={`/api/attachments/${a.id}?variant=thumb`} alt={a.caption || a.filename} className="rounded border border-rule" />
                    ) : (
                      <a className="underline" href={`/api/attachments/${a.id}`}>{a.filename}</a>
                    )}
                    <p className="mt-1 text-xs text-ink-soft">{a.caption}</p>
                  </li>
                ))}
              </ul>
            </section>
          )}
        </aside>
      </div>
    </>
  );
}
