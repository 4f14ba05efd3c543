import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db';
import { findJurisdictionBySlug } from '@/db/jurisdictions';
import { findPublishedVersion } from '@/db/rule-sets';
import type { ImpactItem } from '@/lib/services/rule-sets/comparisons';
import { findLatestImpactRun } from '@/lib/services/rule-sets/runs';
import { runStatusOf } from '@/lib/domain/rule-sets/runs';
import { FindingChanges } from '@/components/admin/dry-run-results';
import { ImpactRunPanel } from '@/components/admin/impact-run-panel';
import { PageHeader } from '@/components/ui/page-header';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';
import { formatDateTime } from '@/lib/domain/dates/format';

export const metadata: Metadata = { title: 'Impact on projects' };

const stateText: Record<ImpactItem['state'], string> = {
  'would-change': 'would now come out differently',
  unchanged: 'would come out the same',
  current: 'already checked against the published version',
  'never-checked': 'no check yet',
};

export default async function ImpactPage({ params, searchParams }: { params: Promise<{ slug: string }>; searchParams: Promise<{ published?: string }> }) {
  const { slug } = await params;
  const { published: justPublished } = await searchParams;
  await requirePageUser(pageRoles['/rules'], `/rules/${slug}/impact`);
  const db = getDb();
  const jurisdiction = await findJurisdictionBySlug(db, slug);
  if (!jurisdiction) notFound();
  const published = await findPublishedVersion(db, jurisdiction.id);
  // Every project is re-evaluated by a job; the page shows the latest run of the published version, or starts one.
  const run = published ? await findLatestImpactRun(db, published.id) : null;
  const impact = run?.state === 'done' ? run.result : null;
  const changing = impact?.items.filter((i) => i.state === 'would-change') ?? [];
  const rest = impact?.items.filter((i) => i.state !== 'would-change') ?? [];

  return (
    <>
      <PageHeader kicker={jurisdiction.name} title="Impact on projects">
        <Link href={`/rules/${slug}`} className="btn-secondary">All versions</Link>
      </PageHeader>
      {justPublished && published && (
        <p role="status" className="card mb-4 border-status-pass p-4 text-sm" data-testid="published-notice">
          Version {published.version} is published: “{published.changelog}”
        </p>
      )}
      {!published ? (
        <p className="card mb-4 p-4 text-sm" data-testid="impact-nothing-published">Nothing is published in {jurisdiction.name} yet: there is no impact on projects to show.</p>
      ) : (
        <ImpactRunPanel
          key={run ? `${run.id}-${run.state}` : 'none'}
          slug={slug}
          version={published.version}
          initial={run && runStatusOf(run)}
          // A failed run is shown with its reason and "Run again" rather than retried on every visit.
          autoStart={!run}
          finishedText={run?.finishedAt ? formatDateTime(run.finishedAt, jurisdiction.timeZone) : null}
        />
      )}
      {impact && impact.adminNotes.length > 0 && (
        <div className="card mb-4 p-4 text-sm" data-testid="impact-admin-notes">
          <p className="font-semibold">To fix in the next version (installers do not see these notes)</p>
          <ul className="mt-1 list-disc pl-5">
            {impact.adminNotes.map((n) => <li key={n.ruleKey}>{n.title}: {n.note}</li>)}
          </ul>
        </div>
      )}
      <p className="mb-4 max-w-prose text-sm text-ink-soft">
        Each project’s latest check is re-evaluated against published version {published?.version ?? '—'}, from the plan it checked.
        The checks themselves stay as they were; their installers see that newer rules are published and can re-run.
      </p>
      {impact && (
        <>
          <section className="card p-5" aria-labelledby="chg-h" data-testid="impact-changing">
            <h2 id="chg-h" className="font-bold">{changing.length} project{changing.length === 1 ? '' : 's'} would now come out differently</h2>
            <ul className="mt-2 divide-y divide-rule">
              {changing.map((i) => (
                <li key={i.projectId} className="py-3" data-project={i.name}>
                  <div className="font-semibold">{i.name}</div>
                  <div className="text-xs text-ink-faint">{i.organization} · latest check {formatDateTime(i.latestCheck!.createdAt, jurisdiction.timeZone)} on v{i.latestCheck!.version}, plan revision {i.latestCheck!.revisionNumber} · was {i.latestCheck!.outcome}, now {i.outcomeNow ?? 'unknown'}</div>
                  {i.error && <p className="text-sm text-status-fail">{i.error}</p>}
                  <FindingChanges changes={i.changes.filter((c) => c.statusChanged)} />
                </li>
              ))}
            </ul>
          </section>
          <section className="card mt-6 p-5" aria-labelledby="rest-h">
            <h2 id="rest-h" className="font-bold">Other open projects</h2>
            {rest.length === 0 ? <p className="text-sm text-ink-soft">None.</p> : (
              <ul className="mt-2 text-sm">
                {rest.map((i) => <li key={i.projectId} data-project={i.name} data-state={i.state}>{i.name} <span className="text-ink-faint">({i.organization}): {stateText[i.state]}</span></li>)}
              </ul>
            )}
          </section>
        </>
      )}
    </>
  );
}
