import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { getDb } from '@/db';
import { InviteForm } from '@/components/people/invite-form';
import { PeopleTable } from '@/components/people/people-table';
import { PendingInvitations } from '@/components/people/pending-invitations';
import { PageHeader } from '@/components/ui/page-header';
import { companyRoles } from '@/lib/domain/accounts/people';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';
import { listPendingInvitations } from '@/lib/services/accounts/invitations';
import { listCompanyMembers } from '@/lib/services/accounts/people';
import { findOrganizationById } from '@/db/organizations';

export const metadata: Metadata = { title: 'People' };

export default async function PeoplePage() {
  const user = await requirePageUser(pageRoles['/people'], '/people');
  if (!user.isOwner) redirect('/forbidden?from=%2Fpeople');
  const db = getDb();
  const [members, invitations, company] = await Promise.all([
    listCompanyMembers(db, user),
    listPendingInvitations(db, user),
    findOrganizationById(db, user.organizationId!),
  ]);
  return (
    <>
      <PageHeader kicker={company?.name ?? 'Your company'} title="People" />
      <p className="mb-6 max-w-3xl text-sm text-ink-soft">
        Everyone here sees and edits the company’s projects. Owners also manage people and the company’s settings. A deactivated
        person is signed out at once and cannot sign in; their projects, checks and reports stay with the company.
      </p>
      <PeopleTable people={members} selfId={user.id} showPlace={false} caption="The company’s people" />
      <div className="mt-6 grid gap-6 lg:grid-cols-2">
        <InviteForm roles={companyRoles} />
        <PendingInvitations invitations={invitations.map((i) => ({ ...i, createdAt: i.createdAt.toISOString(), expiresAt: i.expiresAt.toISOString() }))} />
      </div>
    </>
  );
}
