import type { Metadata } from 'next';
import Link from 'next/link';
import { getDb } from '@/db';
import { listJurisdictionOverview } from '@/db/jurisdictions';
import { timeZoneAbbreviation } from '@/lib/domain/dates/format';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';

export const metadata: Metadata = { title: 'Jurisdictions' };

export default async function JurisdictionsPage() {
  await requirePageUser(pageRoles['/jurisdictions'], '/jurisdictions');
  const list = await listJurisdictionOverview(getDb());
  const now = new Date();
  return (
    <>
      <PageHeader kicker="Administration" title="Jurisdictions">
        <Link href="/jurisdictions/new" className="btn-primary">New jurisdiction</Link>
      </PageHeader>
      {list.length === 0 ? (
        <EmptyState title="No jurisdictions yet">
          <p>Add the first jurisdiction with the code editions it adopted; its rule set follows from those editions.</p>
        </EmptyState>
      ) : (
        <div className="card overflow-x-auto">
          <table className="min-w-full text-sm">
            <caption className="sr-only">Jurisdictions and their adopted code editions</caption>
            <thead className="bg-paper-deep text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr>
                <th scope="col" className="px-4 py-3">Jurisdiction</th>
                <th scope="col" className="px-4 py-3">Building</th>
                <th scope="col" className="px-4 py-3">Electrical</th>
                <th scope="col" className="px-4 py-3">Plumbing</th>
                <th scope="col" className="px-4 py-3">Mechanical</th>
                <th scope="col" className="px-4 py-3">Fuel gas</th>
                <th scope="col" className="px-4 py-3">Rules</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {list.map((j) => (
                <tr key={j.id}>
                  <td className="px-4 py-3">
                    <Link href={`/jurisdictions/${j.slug}`} className="font-semibold underline-offset-2 hover:underline">{j.name}</Link>
                    {j.isDemo && <span className="ml-1 rounded bg-brass-soft px-1.5 text-xs">demo</span>}
                    <div className="text-xs text-ink-faint">{j.region} · <code className="font-mono">{j.slug}</code> · {j.timeZone} ({timeZoneAbbreviation(now, j.timeZone)})</div>
                  </td>
                  <td className="px-4 py-3">{j.editions.building}</td>
                  <td className="px-4 py-3">{j.editions.electrical}</td>
                  <td className="px-4 py-3">{j.editions.plumbing} <span className="text-ink-faint">({j.editions.plumbingFamily})</span></td>
                  <td className="px-4 py-3">{j.editions.mechanical}</td>
                  <td className="px-4 py-3">{j.editions.fuelGas}</td>
                  <td className="px-4 py-3"><Link href={`/rules/${j.slug}`} className="underline">{j.published ? `v${j.published.version}` : 'none published'}{j.draft ? ` · draft v${j.draft.version}` : ''}</Link></td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
