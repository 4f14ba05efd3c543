import type { Metadata } from 'next';
import { getDb } from '@/db';
import { listJurisdictions } from '@/db/jurisdictions';
import { InviteForm } from '@/components/people/invite-form';
import { PeopleTable } from '@/components/people/people-table';
import { PendingInvitations } from '@/components/people/pending-invitations';
import { PageHeader } from '@/components/ui/page-header';
import { peopleFilterSchema } from '@/lib/domain/accounts/people';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';
import { listPendingInvitations } from '@/lib/services/accounts/invitations';
import { listAllPeople } from '@/lib/services/accounts/people';

export const metadata: Metadata = { title: 'Users' };

type Search = Promise<Record<string, string | string[] | undefined>>;

const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);

export default async function UsersPage({ searchParams }: { searchParams: Search }) {
  const user = await requirePageUser(pageRoles['/users'], '/users');
  const raw = await searchParams;
  const parsed = peopleFilterSchema.safeParse({ q: first(raw.q), role: first(raw.role), status: first(raw.status) });
  const filter = parsed.success ? parsed.data : peopleFilterSchema.parse({});
  const db = getDb();
  const [people, invitations, jurisdictions] = await Promise.all([
    listAllPeople(db, user, { search: filter.q, role: filter.role, status: filter.status }),
    listPendingInvitations(db, user),
    listJurisdictions(db),
  ]);
  const choices = jurisdictions.map((j) => ({ id: j.id, slug: j.slug, name: j.name }));
  return (
    <>
      <PageHeader kicker="Administration" title="Users" />
      <form method="get" className="card mb-4 flex flex-wrap items-end gap-3 p-4" role="search" aria-label="Find people">
        <div className="min-w-[14rem] flex-1">
          <label htmlFor="users-q" className="field-label">Search</label>
          <input id="users-q" name="q" defaultValue={filter.q ?? ''} placeholder="name, e-mail, company or jurisdiction" className="field-input" />
        </div>
        <div>
          <label htmlFor="users-role" className="field-label">Role</label>
          <select id="users-role" name="role" defaultValue={filter.role ?? ''} className="field-input">
            <option value="">Any role</option>
            <option value="installer">Installer</option>
            <option value="owner">Company owner</option>
            <option value="inspector">Inspector</option>
            <option value="admin">Admin</option>
          </select>
        </div>
        <div>
          <label htmlFor="users-status" className="field-label">Status</label>
          <select id="users-status" name="status" defaultValue={filter.status ?? ''} className="field-input">
            <option value="">Active and deactivated</option>
            <option value="active">Active</option>
            <option value="deactivated">Deactivated</option>
          </select>
        </div>
        <button type="submit" className="btn-secondary">Filter</button>
        {!parsed.success && <p role="alert" className="field-error w-full">{parsed.error.issues[0]?.message}</p>}
      </form>
      <PeopleTable people={people} selfId={user.id} showPlace jurisdictions={choices} caption="Everyone who can sign in, or could before they were deactivated" />
      <div className="mt-6 grid gap-6 lg:grid-cols-2">
        <InviteForm roles={['inspector', 'admin']} jurisdictions={choices} />
        <PendingInvitations invitations={invitations.map((i) => ({ ...i, createdAt: i.createdAt.toISOString(), expiresAt: i.expiresAt.toISOString() }))} />
      </div>
    </>
  );
}
