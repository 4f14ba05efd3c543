import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db';
import { parsePositiveInt } from '@/lib/domain/integers';
import { findJurisdictionBySlug } from '@/db/jurisdictions';
import { findPublishedVersion, findVersionByNumber } from '@/db/rule-sets';
import { DraftWorkspace } from '@/components/admin/draft-workspace';
import { ParametersForm } from '@/components/admin/parameters-form';
import { RuleTable } from '@/components/admin/rule-editor';
import { CitationChecks } from '@/components/admin/citation-checks';
import { listCitationStatuses } from '@/lib/services/rule-sets/citations';
import { findLatestDryRun } from '@/lib/services/rule-sets/runs';
import { runStatusOf } from '@/lib/domain/rule-sets/runs';
import { VersionStatus } from '@/components/admin/version-status';
import { PageHeader } from '@/components/ui/page-header';
import { SafetyNotice } from '@/components/ui/safety-notice';
import { citationMismatches } from '@/lib/domain/rule-sets/citations';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';
import { formatDateTime } from '@/lib/domain/dates/format';

export const metadata: Metadata = { title: 'Rule set version' };

export default async function VersionPage({ params }: { params: Promise<{ slug: string; version: string }> }) {
  const { slug, version } = await params;
  await requirePageUser(pageRoles['/rules'], `/rules/${slug}/versions/${version}`);
  const db = getDb();
  const jurisdiction = await findJurisdictionBySlug(db, slug);
  const number = parsePositiveInt(version);
  if (!jurisdiction || number === null) notFound();
  const set = await findVersionByNumber(db, jurisdiction.id, number);
  if (!set) notFound();
  const published = await findPublishedVersion(db, jurisdiction.id);
  const mismatches = citationMismatches(set.rules, jurisdiction.editions);
  const dryRun = set.status === 'draft' ? await findLatestDryRun(db, set.id) : null;
  const latestDryRun = dryRun && {
    run: runStatusOf(dryRun),
    result: dryRun.result,
  };

  return (
    <>
      <PageHeader kicker={jurisdiction.name} title={`Rule set version ${set.version}`}>
        <Link href={`/rules/${slug}`} className="btn-secondary">All versions</Link>
        {published && published.id !== set.id && <Link href={`/rules/${slug}/diff?from=${published.version}&to=${set.version}`} className="btn-secondary">Compare with published v{published.version}</Link>}
        {!published && <Link href={`/rules/${slug}/diff?from=baseline&to=${set.version}`} className="btn-secondary">Compare with the model-code baseline</Link>}
      </PageHeader>
      <div className="mb-4 flex flex-wrap items-center gap-3 text-sm">
        <VersionStatus status={set.status} />
        {set.publishedAt && <span>Published {formatDateTime(set.publishedAt, jurisdiction.timeZone)} by {set.publishedBy ?? 'former user'}</span>}
        {set.retiredAt && <span>· retired {formatDateTime(set.retiredAt, jurisdiction.timeZone)}</span>}
        {set.status !== 'draft' && set.changelog && <span data-testid="version-changelog">· “{set.changelog}”</span>}
      </div>
      <div className="mb-6"><SafetyNotice compact /></div>
      {mismatches.length > 0 && (
        <div role="note" className="card mb-6 border-status-caution p-4 text-sm" data-testid="citation-mismatches">
          <p className="font-semibold">{mismatches.length} rule{mismatches.length === 1 ? '' : 's'} cite an edition {jurisdiction.name} did not adopt</p>
          <ul className="mt-1 list-disc pl-5">
            {mismatches.slice(0, 12).map((m) => <li key={m.ruleKey}><span className="font-mono text-xs">{m.ruleKey}</span>: cites {m.cited}, adopted {m.adopted}</li>)}
          </ul>
          <p className="mt-1 text-ink-soft">Re-cite them to the adopted edition, or start a draft from the model-code baseline for these editions.</p>
        </div>
      )}
      {set.status === 'draft' ? (
        <DraftWorkspace initial={set} slug={slug} timeZone={jurisdiction.timeZone} latestDryRun={latestDryRun} />
      ) : (
        <div className="space-y-6">
          <p className="text-sm text-ink-soft">This version is {set.status}: the database refuses any change to it. To change the rules, start a new draft from the versions page.</p>
          <section className="card p-5" aria-labelledby="params-h">
            <h2 id="params-h" className="text-lg font-bold">Parameters</h2>
            <ParametersForm parameters={set.parameters} readOnly />
          </section>
          <section className="card p-5" aria-labelledby="rules-h">
            <h2 id="rules-h" className="text-lg font-bold">Rules ({set.rules.filter((r) => r.enabled).length} of {set.rules.length} enabled)</h2>
            <div className="mt-3"><RuleTable rules={set.rules} readOnly /></div>
          </section>
          <section className="card p-5" aria-labelledby="cite-h">
            <h2 id="cite-h" className="text-lg font-bold">Citations checked against the adopted text</h2>
            <div className="mt-3"><CitationChecks list={await listCitationStatuses(db, set)} url={`/api/rule-sets/${set.id}/citations`} readOnly timeZone={jurisdiction.timeZone} /></div>
          </section>
        </div>
      )}
    </>
  );
}
