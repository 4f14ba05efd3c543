import type { Metadata } from 'next';
import { getDb } from '@/db';
import { findJurisdictionById } from '@/db/jurisdictions';
import { InspectionFilters } from '@/components/inspections/inspection-filters';
import { InspectionsPager } from '@/components/inspections/inspections-pager';
import { InspectionsTable } from '@/components/inspections/inspections-table';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { readInspectionFilter } from '@/lib/domain/reports/inspection-filter';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';
import { listInspectionQueue } from '@/lib/services/reports/inspection-queue';

export const metadata: Metadata = { title: 'Inspections' };

type Search = Promise<Record<string, string | string[] | undefined>>;

const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);

export default async function InspectionsPage({ searchParams }: { searchParams: Search }) {
  const user = await requirePageUser(pageRoles['/inspections'], '/inspections');
  const raw = await searchParams;
  const { filter, errors } = readInspectionFilter(raw);
  const db = getDb();
  const jurisdiction = user.jurisdictionId ? await findJurisdictionById(db, user.jurisdictionId) : null;
  const result = await listInspectionQueue(db, user, filter);
  const filtered = !!(filter.q || filter.outcome || filter.from || filter.to);
  const typed = { q: first(raw.q), from: first(raw.from), to: first(raw.to) };
  return (
    <>
      <PageHeader kicker={jurisdiction ? jurisdiction.name : 'All jurisdictions'} title="Inspections" />
      {result.total === 0 && !filtered && errors.length === 0 ? (
        <EmptyState title="No reports have been sent to you yet">
          <p>
            When an installer sends a check report for a job in your jurisdiction it appears here. You can confirm a
            paper copy is genuine, go through its findings and record an outcome — approved or corrections needed —
            which goes back to the installer.
          </p>
        </EmptyState>
      ) : (
        <>
          <p className="mb-3 max-w-3xl text-sm text-ink-soft">
            Newest first. Project, site address, permit and company are as the report was issued. Dates are whole days in
            UTC, both ends included.
          </p>
          <InspectionFilters filter={filter} typed={typed} errors={errors} />
          {result.items.length > 0 ? (
            <InspectionsTable rows={result.items} />
          ) : (
            <p className="card p-6 text-sm text-ink-soft" data-testid="inspections-none">No reports match these filters.</p>
          )}
          <InspectionsPager filter={filter} total={result.total} page={result.page} pageSize={result.pageSize} />
        </>
      )}
    </>
  );
}
