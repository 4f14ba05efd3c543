import type { Metadata } from 'next';
import { getDb } from '@/db';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { pageRoles } from '@/lib/auth/roles';
import { requirePageUser } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Inspections' };

export default async function InspectionsPage() {
  const user = await requirePageUser(pageRoles['/inspections'], '/inspections');
  const jurisdiction = user.jurisdictionId
    ? await getDb().selectFrom('jurisdictions').select(['name']).where('id', '=', user.jurisdictionId).executeTakeFirst()
    : null;
  return (
    <>
      <PageHeader kicker={jurisdiction ? jurisdiction.name : 'All jurisdictions'} title="Inspections" />
      <EmptyState title="No reports have been sent to you yet">
        <p>
          When an installer sends a check report for a job in your jurisdiction it appears here. You can confirm a
          paper copy is genuine, go through its findings and record an outcome — approved or corrections needed —
          which goes back to the installer.
        </p>
      </EmptyState>
    </>
  );
}
