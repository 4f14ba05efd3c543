import type { Metadata } from 'next';
import Link from 'next/link';
import { getDb } from '@/db';
import { listJurisdictionOverview } from '@/db/jurisdictions';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';

export const metadata: Metadata = { title: 'Rules' };

export default async function RulesPage() {
  await requirePageUser(pageRoles['/rules'], '/rules');
  const list = await listJurisdictionOverview(getDb());
  return (
    <>
      <PageHeader kicker="Administration" title="Rule sets">
        <Link href="/jurisdictions/new" className="btn-secondary">New jurisdiction</Link>
      </PageHeader>
      <p className="mb-4 max-w-prose text-sm text-ink-soft">
        One versioned rule set per jurisdiction. A draft is edited and dry-run, then published; a published version never
        changes again and every check stays pinned to the version it ran on.
      </p>
      {list.length === 0 ? (
        <EmptyState title="No jurisdictions yet" action={<Link href="/jurisdictions/new" className="btn-primary">Add a jurisdiction</Link>}>
          <p>Add the first jurisdiction with the code editions it adopted; its first draft starts from those editions.</p>
        </EmptyState>
      ) : (
        <div className="card overflow-x-auto">
          <table className="min-w-full text-sm">
            <caption className="sr-only">Rule sets by jurisdiction</caption>
            <thead className="bg-paper-deep text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr><th scope="col" className="px-4 py-3">Jurisdiction</th><th scope="col" className="px-4 py-3">Published</th><th scope="col" className="px-4 py-3">Open draft</th><th scope="col" className="px-4 py-3">Versions</th><th scope="col" className="px-4 py-3">Open projects</th></tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {list.map((j) => (
                <tr key={j.id}>
                  <td className="px-4 py-3">
                    <Link href={`/rules/${j.slug}`} className="font-semibold underline-offset-2 hover:underline">{j.name}</Link>
                    {j.isDemo && <span className="ml-1 rounded bg-brass-soft px-1.5 text-xs">demo</span>}
                    <div className="text-xs text-ink-faint">{j.editions.building} · {j.editions.electrical} · {j.editions.plumbing}</div>
                  </td>
                  <td className="px-4 py-3">{j.published ? <Link className="underline" href={`/rules/${j.slug}/versions/${j.published.version}`}>version {j.published.version}</Link> : <span className="text-status-caution">none: checks cannot run</span>}</td>
                  <td className="px-4 py-3">{j.draft ? <Link className="underline" href={`/rules/${j.slug}/versions/${j.draft.version}`}>version {j.draft.version}</Link> : '—'}</td>
                  <td className="px-4 py-3">{j.versions}</td>
                  <td className="px-4 py-3">{j.projects}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
