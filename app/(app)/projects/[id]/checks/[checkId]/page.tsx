import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db';
import { findJurisdictionById, jurisdictionHasInspectors } from '@/db/jurisdictions';
import { isEmailConfirmed } from '@/db/accounts';
import { findCheck, previousCheck } from '@/db/checks';
import { citationText } from '@/lib/domain/vocabulary';
import { FindingsList } from '@/components/checks/findings-list';
import { ReportActions } from '@/components/reports/report-actions';
import { RunCheckButton } from '@/components/checks/run-check-button';
import { SummaryCounts } from '@/components/checks/summary-counts';
import { ProjectHeader } from '@/components/projects/project-header';
import { SafetyNotice } from '@/components/ui/safety-notice';
import { statusLabel } from '@/components/ui/status-badge';
import { compareFindings } from '@/lib/domain/checks/compare';
import { loadProjectPage } from '@/lib/services/projects/project-page';
import { findingCommentsOfCheck } from '@/lib/services/reports/finding-comments';
import { formatDateTime } from '@/lib/domain/dates/format';

export const metadata: Metadata = { title: 'Check' };

export default async function CheckPage({ params }: { params: Promise<{ id: string; checkId: string }> }) {
  const { id, checkId } = await params;
  const { user, project, published } = await loadProjectPage(id, `/projects/${id}/checks/${checkId}`);
  const db = getDb();
  const check = await findCheck(db, user, checkId);
  if (!check || check.projectId !== project.id) notFound();
  const [prev, comments] = await Promise.all([previousCheck(db, check), findingCommentsOfCheck(db, check.id)]);
  const changes = prev ? compareFindings(prev.findings, check.findings) : [];
  const newer = published && published.version > check.ruleSet.version;
  const inspectorEmail = (await findJurisdictionById(db, project.jurisdiction.id))?.inspectorEmail ?? null;
  const hasInspectors = user.role === 'installer' && (await jurisdictionHasInspectors(db, project.jurisdiction.id));
  const unconfirmedEmail = user.role === 'installer' && !(await isEmailConfirmed(db, user.id)) ? user.email : null;
  const cited = [...new Set(check.findings.filter((f) => f.status !== 'not-applicable').map((f) => citationText(f.citation)))];

  return (
    <>
      <ProjectHeader project={project} current="/checks" />
      <div className="mb-4 flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 className="text-xl font-bold">
            Check of plan revision {check.planRevision.number}
          </h2>
          <p className="text-sm text-ink-soft" data-testid="check-meta">
            {formatDateTime(check.createdAt, project.jurisdiction.timeZone)} · {project.jurisdiction.name} rule set version {check.ruleSet.version} · run by {check.createdBy.name ?? 'former user'}
          </p>
        </div>
        <div className="no-print flex gap-2">
          <Link href={`/projects/${project.id}/plan`} className="btn-secondary">Edit plan</Link>
          <Link href={`/projects/${project.id}/drawing`} className="btn-secondary">Drawing</Link>
          <a href={`/api/checks/${check.id}/findings.csv`} download className="btn-secondary">Findings as CSV</a>
          {user.role === 'installer' && <RunCheckButton projectId={project.id} label="Run again" />}
        </div>
      </div>

      {newer && (
        <div role="status" className="card mb-4 border-brass p-4" data-testid="newer-rules">
          <p className="font-semibold">Version {published!.version} of the rules is published; this check used version {check.ruleSet.version} and stays as it was.</p>
          <p className="mt-1 text-sm text-ink-soft">{published!.changelog}</p>
          {user.role === 'installer' && <div className="mt-3"><RunCheckButton projectId={project.id} label={`Re-run against version ${published!.version}`} /></div>}
        </div>
      )}

      <SummaryCounts summary={check.summary} />

      <div className="mt-4"><SafetyNotice /></div>

      <section className="mt-6" aria-labelledby="findings-h" data-testid="check-findings">
        <h2 id="findings-h" className="sr-only">Findings</h2>
        <FindingsList findings={check.findings} changedKeys={changes.map((c) => c.ruleKey)} comments={comments} timeZone={project.jurisdiction.timeZone} />
      </section>

      {/* The findings come first: at the job site the installer opens the check to see what fails. */}
      <div className="mt-6" data-testid="check-report-actions">
        <ReportActions checkId={check.id} inspectorEmail={inspectorEmail} jurisdictionName={project.jurisdiction.name} failing={check.summary.fail} hasInspectors={hasInspectors} canSend={user.role === 'installer'} unconfirmedEmail={unconfirmedEmail} />
      </div>

      {prev && (
        <section className="card mt-6 p-5" aria-labelledby="since-h" data-testid="changes-since">
          <h2 id="since-h" className="font-bold">Since the previous check ({formatDateTime(prev.createdAt, project.jurisdiction.timeZone)}, revision {prev.planRevision.number}, rules v{prev.ruleSet.version})</h2>
          {changes.length === 0 ? (
            <p className="mt-2 text-sm text-ink-soft">No finding changed status.</p>
          ) : (
            <ul className="mt-2 space-y-1 text-sm">
              {changes.map((c) => (
                <li key={c.ruleKey}>
                  <span className="font-semibold">{c.title}</span>: {c.from ? statusLabel[c.from] : 'new rule'} → {c.to ? statusLabel[c.to] : 'rule removed'}
                </li>
              ))}
            </ul>
          )}
        </section>
      )}


      <section className="card mt-6 p-5 text-sm" aria-labelledby="cited-h">
        <h2 id="cited-h" className="font-bold">Sections checked</h2>
        <p className="mt-2 font-mono text-xs leading-relaxed">{cited.join(' · ')}</p>
      </section>
    </>
  );
}
