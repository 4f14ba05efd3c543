import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db';
import { findJurisdictionBySlug } from '@/db/jurisdictions';
import { listJurisdictionAudit } from '@/db/audit';
import { listVersions } from '@/db/rule-sets';
import { AuditList } from '@/components/admin/audit-list';
import { StartDraft } from '@/components/admin/start-draft';
import { VersionStatus } from '@/components/admin/version-status';
import { PageHeader } from '@/components/ui/page-header';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';
import { formatDate, formatDateTime } from '@/lib/domain/dates/format';

export const metadata: Metadata = { title: 'Rule set versions' };

export default async function JurisdictionRulesPage({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  await requirePageUser(pageRoles['/rules'], `/rules/${slug}`);
  const db = getDb();
  const jurisdiction = await findJurisdictionBySlug(db, slug);
  if (!jurisdiction) notFound();
  const [versions, audit] = await Promise.all([listVersions(db, jurisdiction.id), listJurisdictionAudit(db, jurisdiction.id, 50)]);
  const draft = versions.find((v) => v.status === 'draft');
  const published = versions.find((v) => v.status === 'published');

  return (
    <>
      <PageHeader kicker="Rule set" title={jurisdiction.name}>
        <Link href={`/jurisdictions/${slug}`} className="btn-secondary">Jurisdiction details</Link>
        <Link href={`/rules/${slug}/impact`} className="btn-secondary">Impact on projects</Link>
      </PageHeader>
      <p className="mb-4 text-sm text-ink-soft">
        Adopted: {jurisdiction.editions.building}, {jurisdiction.editions.electrical}, {jurisdiction.editions.plumbing} ({jurisdiction.editions.plumbingFamily}), {jurisdiction.editions.mechanical}, {jurisdiction.editions.fuelGas}.
        {jurisdiction.amendmentNotes && <> Local amendments: {jurisdiction.amendmentNotes}</>}
      </p>

      <div className="mb-6">
        {draft ? (
          <p className="text-sm">Draft version {draft.version} is open. <Link href={`/rules/${slug}/versions/${draft.version}`} className="font-semibold underline">Continue the draft</Link></p>
        ) : (
          <StartDraft slug={slug} hasPublished={!!published} />
        )}
      </div>

      <section className="card overflow-x-auto" aria-labelledby="versions-h">
        <h2 id="versions-h" className="px-4 pt-4 font-bold">Versions</h2>
        <table className="mt-2 min-w-full text-sm">
          <thead className="bg-paper-deep text-left text-xs uppercase tracking-wide text-ink-soft">
            <tr><th className="px-4 py-2">Version</th><th className="px-4 py-2">State</th><th className="px-4 py-2">Changelog</th><th className="px-4 py-2">Published</th><th className="px-4 py-2">Rules</th></tr>
          </thead>
          <tbody className="divide-y divide-rule">
            {versions.map((v) => (
              <tr key={v.id} data-version={v.version}>
                <td className="px-4 py-2"><Link className="font-semibold underline" href={`/rules/${slug}/versions/${v.version}`}>v{v.version}</Link></td>
                <td className="px-4 py-2"><VersionStatus status={v.status} /></td>
                <td className="max-w-md px-4 py-2">{v.changelog || <span className="text-ink-faint">—</span>}</td>
                <td className="px-4 py-2 text-xs">{v.publishedAt ? <>{formatDateTime(v.publishedAt, jurisdiction.timeZone)}<br />{v.publishedBy}</> : '—'}{v.retiredAt && <><br />retired {formatDate(v.retiredAt, jurisdiction.timeZone)}</>}</td>
                <td className="px-4 py-2">{v.enabledCount} of {v.ruleCount}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      {versions.length === 1 && (
        <p className="mt-6 text-sm"><Link href={`/rules/${slug}/diff?from=baseline&to=${versions[0].version}`} className="font-semibold underline">Compare version {versions[0].version} with the model-code baseline</Link></p>
      )}
      {versions.length > 1 && (
        <form action={`/rules/${slug}/diff`} className="card mt-6 flex flex-wrap items-end gap-3 p-4" aria-label="Compare versions">
          <div>
            <label htmlFor="diff-from" className="field-label">Compare</label>
            <select id="diff-from" name="from" className="field-input" defaultValue={String(versions[1].version)}>
              {versions.map((v) => <option key={v.id} value={v.version}>version {v.version} ({v.status})</option>)}
            </select>
          </div>
          <div>
            <label htmlFor="diff-to" className="field-label">with</label>
            <select id="diff-to" name="to" className="field-input" defaultValue={String(versions[0].version)}>
              {versions.map((v) => <option key={v.id} value={v.version}>version {v.version} ({v.status})</option>)}
            </select>
          </div>
          <button type="submit" className="btn-secondary">Show differences</button>
        </form>
      )}

      <section className="card mt-6 p-5" aria-labelledby="audit-h">
        <h2 id="audit-h" className="font-bold">Audit trail</h2>
        <AuditList items={audit} timeZone={jurisdiction.timeZone} />
      </section>
    </>
  );
}
