import type { FindingChange } from '@/lib/domain/checks/compare';
import { OUTCOME_LABEL, type ThreadEntry } from '@/lib/domain/reports/thread';
import { StatusBadge, statusLabel } from '@/components/ui/status-badge';
import { formatDateTime } from '@/lib/domain/dates/format';

type PlanValueChange = { path: string; label: string; from: string; to: string };
export type ThreadSectionEntry = ThreadEntry | (Extract<ThreadEntry, { kind: 'answer' }> & { changes: { findings: FindingChange[]; plan: PlanValueChange[] } });

const statusText = (s: FindingChange['from']) => (s ? statusLabel[s] : 'not in this check');

/**
 * The conversation on one sent report, oldest first, as both the installer and the inspector read it:
 * the send and its note, each outcome (revisions say which one they replace), each answer with what
 * changed between the check the inspector saw and the answering one.
 */
export function ThreadSection({ entries, findingTitles, headingId, heading = 'Inspection thread', findingLinks, timeZone }: {
  entries: ThreadSectionEntry[];
  /** The project's jurisdiction's IANA zone. */
  timeZone: string;
  findingTitles: Record<string, string>;
  headingId: string;
  heading?: string;
  /** On the installer's project page: each commented finding links to it on the check the outcome was about. */
  findingLinks?: { projectId: string; reportedCheckId: string };
}) {
  const when = (d: Date | string) => formatDateTime(d, timeZone);
  const outcomeAt = new Map(entries.filter((e) => e.kind === 'outcome').map((e) => [e.id, e.at]));
  const answerCheck = new Map(entries.flatMap((e) => (e.kind === 'answer' ? [[e.id, e.checkId] as const] : [])));
  const findingHref = (e: Extract<ThreadEntry, { kind: 'outcome' }>, ruleKey: string) => {
    if (!findingLinks) return null;
    const checkId = (e.answerId && answerCheck.get(e.answerId)) || findingLinks.reportedCheckId;
    return `/projects/${findingLinks.projectId}/checks/${checkId}#finding-${ruleKey}`;
  };
  return (
    <section className="card p-5 text-sm" aria-labelledby={headingId} data-testid="thread">
      <h2 id={headingId} className="text-lg font-bold">{heading}</h2>
      <ol className="mt-3 space-y-4">
        {entries.map((e, i) => (
          <li key={`${e.kind}-${i}`} className="border-l-2 border-rule pl-3" data-testid={`thread-${e.kind}`}>
            {e.kind === 'sent' && (
              <>
                <p><span className="font-semibold">Report {e.reportCode} sent to {e.to}</span> <span className="text-ink-soft">· {e.by ?? 'former user'} · {when(e.at)}</span></p>
                {e.note && <p className="mt-1 whitespace-pre-line"><span className="font-semibold">Installer’s note:</span> {e.note}</p>}
              </>
            )}
            {e.kind === 'outcome' && (
              <>
                <p>
                  {e.outcome === 'approved' ? <StatusBadge status="pass" label={OUTCOME_LABEL.approved} /> : <StatusBadge status="fail" label={OUTCOME_LABEL['corrections-needed']} />}
                  <span className="ml-2 text-ink-soft">{e.inspectorName ?? 'Inspector'} · {when(e.at)}</span>
                </p>
                {e.revisesId && <p className="mt-1 text-ink-soft">Revises the outcome recorded {outcomeAt.get(e.revisesId) ? when(outcomeAt.get(e.revisesId)!) : 'earlier'}.</p>}
                {e.comment && <p className="mt-1 whitespace-pre-line">{e.comment}</p>}
                {Object.entries(e.findingComments).length > 0 && (
                  <ul className="mt-1 space-y-1">
                    {Object.entries(e.findingComments).map(([k, c]) => {
                      const href = findingHref(e, k);
                      const title = findingTitles[k] ?? k;
                      return (
                        <li key={k}>
                          <p data-testid="outcome-finding-comment">
                            {href ? <a className="font-semibold text-ink underline underline-offset-2" href={href}>{title}</a> : <span className="font-semibold">{title}</span>}: {c}
                          </p>
                        </li>
                      );
                    })}
                  </ul>
                )}
              </>
            )}
            {e.kind === 'answer' && (
              <>
                <p>
                  <span className="font-semibold">Corrections answered with a new check, report <a className="underline" href={`/api/reports/${e.reportCode}/pdf`}>{e.reportCode}</a></span>
                  <span className="text-ink-soft"> · {e.installerName ?? 'former user'} · {when(e.at)}</span>
                </p>
                <p className="mt-1 whitespace-pre-line"><span className="font-semibold">Installer’s note:</span> {e.note}</p>
                {'changes' in e && <AnswerChanges findings={e.changes.findings} plan={e.changes.plan} />}
              </>
            )}
          </li>
        ))}
      </ol>
    </section>
  );
}

function AnswerChanges({ findings, plan }: { findings: FindingChange[]; plan: PlanValueChange[] }) {
  return (
    <div className="mt-2 grid gap-3 sm:grid-cols-2" data-testid="answer-changes">
      <div>
        <h3 className="font-semibold">Findings that changed</h3>
        {findings.length === 0 ? (
          <p className="text-ink-soft">No finding changed status.</p>
        ) : (
          <ul className="mt-1 space-y-1">
            {findings.map((f) => (
              <li key={f.ruleKey}>{f.title}: {statusText(f.from)} → {statusText(f.to)}</li>
            ))}
          </ul>
        )}
      </div>
      <div>
        <h3 className="font-semibold">Plan values that changed</h3>
        {plan.length === 0 ? (
          <p className="text-ink-soft">The plan is unchanged.</p>
        ) : (
          <ul className="mt-1 space-y-1">
            {plan.map((c) => (
              <li key={c.path}>{c.label}: {c.from} → {c.to}</li>
            ))}
          </ul>
        )}
      </div>
    </div>
  );
}
