import type { Metadata } from 'next';
import Link from 'next/link';
import { getDb } from '@/db';
import { listChecks } from '@/db/checks';
import { listPlanRevisions } from '@/db/plan-revisions';
import { RunCheckButton } from '@/components/checks/run-check-button';
import { AttachmentsPanel } from '@/components/projects/attachments-panel';
import { DuplicateProjectButton } from '@/components/projects/duplicate-project-button';
import { listProjectSends } from '@/db/reports';
import { ProjectThreads } from '@/components/reports/project-threads';
import { ProjectHeader } from '@/components/projects/project-header';
import { SafetyNotice } from '@/components/ui/safety-notice';
import { StatusBadge } from '@/components/ui/status-badge';
import { MailDelivery } from '@/components/mail/mail-delivery';
import { mailDeliveryProps } from '@/lib/domain/mail/outbox';
import { listMailOfReadableReports } from '@/lib/services/mail/outbox';
import { loadProjectPage } from '@/lib/services/projects/project-page';
import { loadProjectThreads } from '@/lib/services/reports/thread';
import { formatDate, formatDateTime } from '@/lib/domain/dates/format';

export const metadata: Metadata = { title: 'Project' };

export default async function ProjectPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { user, project, published } = await loadProjectPage(id, `/projects/${id}`);
  const db = getDb();
  const [checks, revisions, sends, threads] = await Promise.all([
    listChecks(db, user, id),
    listPlanRevisions(db, user, id),
    listProjectSends(db, id),
    loadProjectThreads(db, user, id),
  ]);
  const mails = await listMailOfReadableReports(db, [...new Set(sends.map((s) => s.report_id))]);
  const mailOfSend = new Map(mails.filter((m) => m.reportSendId).map((m) => [m.reportSendId!, m]));
  const latest = checks[0];
  const newerRules = latest && published && latest.ruleSet.version < published.version;
  const canRun = user.role === 'installer' && revisions.length > 0 && !!published;

  return (
    <>
      <ProjectHeader project={project} current="" />
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <div className="space-y-6">
          {newerRules && (
            <div role="status" className="card border-brass p-4" data-testid="newer-rules">
              <p className="font-semibold">Newer rules are published for {project.jurisdiction.name}: version {published!.version}.</p>
              <p className="mt-1 text-sm text-ink-soft">{published!.changelog}</p>
              <p className="mt-1 text-sm text-ink-soft">The latest check ran on version {latest.ruleSet.version}; it stays as it was. Re-run to check against the new version.</p>
              {user.role === 'installer' && <div className="mt-3"><RunCheckButton projectId={project.id} label={`Re-run against version ${published!.version}`} /></div>}
            </div>
          )}

          <section className="card p-5" aria-labelledby="checks-h">
            <div className="flex flex-wrap items-center justify-between gap-3">
              <h2 id="checks-h" className="text-lg font-bold">Checks</h2>
              {canRun && <RunCheckButton projectId={project.id} />}
            </div>
            {!published && <p className="mt-2 text-sm text-status-caution">{project.jurisdiction.name} has no published rule set yet, so checks cannot run.</p>}
            {checks.length === 0 ? (
              <p className="mt-3 text-sm text-ink-soft">
                {revisions.length === 0 ? 'Describe the closet on the Plan tab, save it, then run the first check.' : 'No checks yet. Run one to see what passes before you build.'}
              </p>
            ) : (
              <table className="mt-3 min-w-full text-sm">
                <caption className="sr-only">Check history</caption>
                <thead className="text-left text-xs uppercase tracking-wide text-ink-faint">
                  <tr><th className="py-2">When</th><th>Plan</th><th>Rules</th><th>Result</th><th>Counts</th></tr>
                </thead>
                <tbody className="divide-y divide-rule">
                  {checks.map((c) => (
                    <tr key={c.id}>
                      <td className="py-2"><Link className="font-semibold underline-offset-2 hover:underline" href={`/projects/${project.id}/checks/${c.id}`}>{formatDateTime(c.createdAt, project.jurisdiction.timeZone)}</Link></td>
                      <td>rev. {c.planRevision.number}</td>
                      <td>v{c.ruleSet.version}</td>
                      <td>{c.outcome === 'pass' ? <StatusBadge status="pass" label="Passes" /> : c.outcome === 'fail' ? <StatusBadge status="fail" label="Fails" /> : <StatusBadge status="needs-info" label="Incomplete" />}</td>
                      <td className="font-mono text-xs">{c.summary.fail} fail · {c.summary.caution} caution · {c.summary.needsInfo} info · {c.summary.pass} pass</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </section>
          {threads.length > 0 && (
            <ProjectThreads
              projectId={project.id}
              threads={threads}
              canAnswer={user.role === 'installer'}
              timeZone={project.jurisdiction.timeZone}
              latestCheck={latest ? { id: latest.id, createdAt: latest.createdAt, counts: `${latest.summary.fail} fail · ${latest.summary.caution} caution · ${latest.summary.needsInfo} info · ${latest.summary.pass} pass` } : null}
            />
          )}
          <AttachmentsPanel projectId={project.id} canEdit={user.role === 'installer'} />
          {sends.length > 0 && (
            <section className="card p-5 text-sm" aria-labelledby="sends-h">
              <h2 id="sends-h" className="text-lg font-bold">Reports sent</h2>
              <ul className="mt-2 space-y-1" data-testid="sends">
                {sends.map((s) => (
                  <li key={s.id}>
                    {s.status === 'sent' ? <StatusBadge status="pass" label="Sent" /> : <StatusBadge status="fail" label="Failed" />}
                    <span className="ml-2">report {s.code} to {s.to_email}{s.to_inspector === false ? ' (e-mail only, not in the inspector’s queue)' : ''} · {s.sent_by ?? 'former user'} · {formatDateTime(s.created_at, project.jurisdiction.timeZone)}</span>
                    {s.error && <span className="block text-status-fail">{s.error}</span>}
                    {mailOfSend.has(s.id) && (
                      <span className="block">
                        <MailDelivery initial={mailDeliveryProps(mailOfSend.get(s.id)!)} />
                      </span>
                    )}
                  </li>
                ))}
              </ul>
            </section>
          )}
          <SafetyNotice />
        </div>

        <aside className="space-y-6">
          <section className="card p-5 text-sm" aria-labelledby="rules-h">
            <h2 id="rules-h" className="font-bold">Jurisdiction</h2>
            <p className="mt-1">{project.jurisdiction.name}</p>
            <p className="mt-1 text-ink-soft">{published ? `Rule set version ${published.version}, published ${published.publishedAt ? formatDate(published.publishedAt, project.jurisdiction.timeZone) : 'on an unrecorded date'}` : 'No published rule set'}</p>
            {user.role === 'installer' && <Link href={`/projects/${project.id}/edit`} className="mt-3 inline-block underline">Edit project details</Link>}
            {user.role === 'installer' && (
              <DuplicateProjectButton projectId={project.id} name={project.name} siteAddress={project.siteAddress} revisions={revisions.map((r) => r.number)} />
            )}
          </section>
          <section className="card p-5 text-sm" aria-labelledby="revs-h">
            <div className="flex items-center justify-between">
              <h2 id="revs-h" className="font-bold">Plan revisions</h2>
              <Link href={`/projects/${project.id}/plan`} className="underline">Open plan</Link>
            </div>
            {revisions.length === 0 ? (
              <p className="mt-2 text-ink-soft">No plan saved yet.</p>
            ) : (
              <ol className="mt-2 space-y-2" data-testid="revisions">
                {revisions.map((r) => (
                  <li key={r.id}>
                    <Link href={`/projects/${project.id}/plan?revision=${r.number}`} className="font-semibold underline-offset-2 hover:underline">Revision {r.number}</Link>
                    <span className="text-ink-faint"> · {r.createdBy.name ?? 'former user'} · {formatDateTime(r.createdAt, project.jurisdiction.timeZone)}</span>
                    <div className="text-ink-soft">{r.changeSummary}</div>
                  </li>
                ))}
              </ol>
            )}
          </section>
        </aside>
      </div>
    </>
  );
}
