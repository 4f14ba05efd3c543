import type { Metadata } from 'next';
import { getDb } from '@/db';
import { findJurisdictionById } from '@/db/jurisdictions';
import { findOrganizationById } from '@/db/organizations';
import { listLiveSessions } from '@/db/sessions';
import { ApiTokens } from '@/components/account/api-tokens';
import { Sessions } from '@/components/account/sessions';
import { PageHeader } from '@/components/ui/page-header';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageSession } from '@/lib/platform/auth/session';

export const metadata: Metadata = { title: 'Account' };

export default async function AccountPage() {
  const { user, sessionId } = await requirePageSession(pageRoles['/account'], '/account');
  const db = getDb();
  const sessions = await listLiveSessions(db, user.id);
  const org = user.organizationId ? await findOrganizationById(db, user.organizationId) : null;
  const jur = user.jurisdictionId ? await findJurisdictionById(db, user.jurisdictionId) : null;
  return (
    <>
      <PageHeader kicker="Your account" title={user.name} />
      <div className="grid gap-6 lg:grid-cols-[1fr_2fr]">
        <section className="card p-6 text-sm" aria-labelledby="profile-heading">
          <h2 id="profile-heading" className="text-lg font-bold">Profile</h2>
          <dl className="mt-3 space-y-2">
            <div><dt className="text-ink-faint">E-mail</dt><dd className="font-mono">{user.email}</dd></div>
            <div><dt className="text-ink-faint">Role</dt><dd className="capitalize">{user.role}</dd></div>
            {org && <div><dt className="text-ink-faint">Company</dt><dd>{org.name}{org.licenseNumber ? ` · licence ${org.licenseNumber}` : ''}</dd></div>}
            {jur && <div><dt className="text-ink-faint">Jurisdiction</dt><dd>{jur.name}</dd></div>}
          </dl>
        </section>
        <ApiTokens />
      </div>
      <div className="mt-6">
        <Sessions sessions={sessions} currentId={sessionId} />
      </div>
    </>
  );
}
