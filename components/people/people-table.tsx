import type { Person } from '@/db/people';
import { PersonActions } from '@/components/people/person-actions';
import { DEFAULT_TIME_ZONE, formatDate } from '@/lib/domain/dates/format';

const roleName = (p: Person) => (p.role === 'installer' ? (p.isOwner ? 'Owner' : 'Installer') : p.role === 'inspector' ? 'Inspector' : 'Admin');

/** People with their status and, for whoever may change them, the controls. */
export function PeopleTable({
  people,
  selfId,
  showPlace,
  jurisdictions,
  caption,
}: {
  people: Person[];
  selfId: string;
  showPlace: boolean;
  jurisdictions?: { id: string; slug: string; name: string }[];
  caption: string;
}) {
  return (
    // Focusable so a keyboard can scroll the table on a phone.
    <div className="card overflow-x-auto" tabIndex={0} role="region" aria-label={caption}>
      <table className="min-w-full text-sm" data-testid="people-table">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper-deep text-left text-xs uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-4 py-3">Name</th>
            <th scope="col" className="px-4 py-3">E-mail</th>
            <th scope="col" className="px-4 py-3">Role</th>
            {showPlace && <th scope="col" className="px-4 py-3">Company or jurisdiction</th>}
            <th scope="col" className="px-4 py-3">Status</th>
            <th scope="col" className="px-4 py-3">Change</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {people.map((p) => (
            <tr key={p.id} data-email={p.email}>
              <td className="px-4 py-3 font-semibold">{p.name}{p.id === selfId ? ' (you)' : ''}</td>
              <td className="px-4 py-3 font-mono text-xs">{p.email}</td>
              <td className="px-4 py-3">{roleName(p)}</td>
              {showPlace && <td className="px-4 py-3">{p.organizationName ?? p.jurisdictionName ?? '—'}</td>}
              <td className="px-4 py-3" data-testid="person-status">
                {p.deactivatedAt ? <span className="text-status-fail">Deactivated {formatDate(p.deactivatedAt, DEFAULT_TIME_ZONE)}</span> : 'Active'}
              </td>
              <td className="px-4 py-3">
                <PersonActions
                  person={{ id: p.id, name: p.name, email: p.email, role: p.role, isOwner: p.isOwner, jurisdictionId: p.jurisdictionId, deactivatedAt: p.deactivatedAt?.toISOString() ?? null }}
                  isSelf={p.id === selfId}
                  jurisdictions={jurisdictions}
                />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {people.length === 0 && <p className="px-4 py-6 text-sm text-ink-soft">Nobody matches.</p>}
    </div>
  );
}
