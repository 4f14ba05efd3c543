import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db';
import { findJurisdictionBySlug } from '@/db/jurisdictions';
import { findVersionByNumber, listVersions } from '@/db/rule-sets';
import { DiffView } from '@/components/admin/diff-view';
import { PageHeader } from '@/components/ui/page-header';
import { diffRuleSets } from '@/lib/domain/rule-sets/diff';
import { describeParameterChanges } from '@/lib/domain/params/describe';
import { baselineLabel, baselineRuleSet } from '@/lib/services/rule-sets/comparisons';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';
import { parsePositiveInt } from '@/lib/domain/integers';

export const metadata: Metadata = { title: 'Compare rule set versions' };

export default async function DiffPage({ params, searchParams }: { params: Promise<{ slug: string }>; searchParams: Promise<{ from?: string; to?: string }> }) {
  const { slug } = await params;
  const query = await searchParams;
  await requirePageUser(pageRoles['/rules'], `/rules/${slug}/diff`);
  const db = getDb();
  const jurisdiction = await findJurisdictionBySlug(db, slug);
  if (!jurisdiction) notFound();
  // `from=baseline`: the model codes for the version's editions, the only thing to compare a
  // first version with before anything is published.
  const fromBaseline = query.from === BASELINE;
  const fromNumber = fromBaseline ? 0 : parsePositiveInt(query.from);
  const toNumber = parsePositiveInt(query.to);
  if (fromNumber === null || toNumber === null) {
    const versions = await listVersions(db, jurisdiction.id);
    return <PickVersions slug={slug} name={jurisdiction.name} versions={versions.map((v) => ({ version: v.version, status: v.status }))} from={query.from} to={query.to} />;
  }
  const to = await findVersionByNumber(db, jurisdiction.id, toNumber);
  if (!to) notFound();
  const from = fromBaseline ? baselineRuleSet(to) : await findVersionByNumber(db, jurisdiction.id, fromNumber);
  if (!from) notFound();
  const label = (s: typeof to) => `v${s.version} (${s.status})`;
  const fromLabel = fromBaseline ? 'Model-code baseline' : label(from);
  return (
    <>
      <PageHeader kicker={jurisdiction.name} title={fromBaseline ? `Model-code baseline → version ${to.version}` : `Version ${from.version} → version ${to.version}`}>
        <Link href={`/rules/${slug}`} className="btn-secondary">All versions</Link>
      </PageHeader>
      {fromBaseline && <p className="mb-4 max-w-prose text-sm text-ink-soft" data-testid="diff-baseline">Compared with {baselineLabel(to)}: what this version changes from the model codes it was started from.</p>}
      <DiffView diff={diffRuleSets(from, to)} parameterChanges={describeParameterChanges(from.parameters, to.parameters)} fromLabel={fromLabel} toLabel={label(to)} />
    </>
  );
}

const BASELINE = 'baseline';

type VersionOption = { version: number; status: string };

/** Reached without two version numbers (a hand-typed or cut-off link): say so and let the admin pick them. */
function PickVersions({ slug, name, versions, from, to }: { slug: string; name: string; versions: VersionOption[]; from?: string; to?: string }) {
  const given = from !== undefined || to !== undefined;
  const newest = versions[0]?.version;
  // A single version (nothing published yet) is compared with the baseline it started from.
  const previous = versions[1]?.version ?? BASELINE;
  const select = (id: string, label: string, preset: number | string | undefined) => (
    <div>
      <label htmlFor={id} className="field-label">{label}</label>
      <select id={id} name={id} defaultValue={preset} className="field-input">
        {id === 'from' && <option value={BASELINE}>the model-code baseline</option>}
        {versions.map((v) => (
          <option key={v.version} value={v.version}>v{v.version} ({v.status})</option>
        ))}
      </select>
    </div>
  );
  return (
    <>
      <PageHeader kicker={name} title="Compare rule set versions">
        <Link href={`/rules/${slug}`} className="btn-secondary">All versions</Link>
      </PageHeader>
      <p role={given ? 'alert' : undefined} className="mb-4 text-sm text-slate-700">
        {given ? 'The link names no valid pair of versions (?from=<n>&to=<n>, each a version number). ' : ''}
        Pick the two versions to compare.
      </p>
      {versions.length === 0 ? (
        <p className="text-sm text-slate-700">This jurisdiction has no rule set versions yet.</p>
      ) : (
        <form method="get" className="flex flex-wrap items-end gap-4">
          {select('from', 'From version', previous)}
          {select('to', 'To version', newest)}
          <button type="submit" className="btn-primary">Compare</button>
        </form>
      )}
    </>
  );
}
