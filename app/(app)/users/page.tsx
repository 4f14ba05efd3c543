import type { Metadata } from 'next';
import { getDb } from '@/db';
import { listUsers } from '@/db/users';
import { PageHeader } from '@/components/ui/page-header';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';

export const metadata: Metadata = { title: 'Users' };

export default async function UsersPage() {
  await requirePageUser(pageRoles['/users'], '/users');
  const users = await listUsers(getDb());
  return (
    <>
      <PageHeader kicker="Administration" title="Users" />
      {/* Focusable so a keyboard can scroll the table on a phone. */}
      <div className="card overflow-x-auto" tabIndex={0} role="region" aria-label="Users">
        <table className="min-w-full text-sm">
          <caption className="sr-only">Everyone who can sign in</caption>
          <thead className="bg-paper-deep text-left text-xs uppercase tracking-wide text-ink-soft">
            <tr>
              <th scope="col" className="px-4 py-3">Name</th>
              <th scope="col" className="px-4 py-3">E-mail</th>
              <th scope="col" className="px-4 py-3">Role</th>
              <th scope="col" className="px-4 py-3">Company or jurisdiction</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-rule">
            {users.map((u) => (
              <tr key={u.id}>
                <td className="px-4 py-3 font-semibold">{u.name}</td>
                <td className="px-4 py-3 font-mono text-xs">{u.email}</td>
                <td className="px-4 py-3 capitalize">{u.role}</td>
                <td className="px-4 py-3">{u.organizationName ?? u.jurisdictionName ?? '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
