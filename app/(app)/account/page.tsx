import type { Metadata } from 'next';
import { getDb } from '@/db';
import { findJurisdictionById } from '@/db/jurisdictions';
import { findOrganizationById } from '@/db/organizations';
import { listLiveSessions } from '@/db/sessions';
import { findAccountById } from '@/db/accounts';
import { ApiTokens } from '@/components/account/api-tokens';
import { NewPasswordForm } from '@/components/auth/new-password-form';
import { ResendConfirmation } from '@/components/auth/resend-confirmation';
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
  const confirmed = !!(await findAccountById(db, user.id))?.emailConfirmedAt;
  return (
    <>
      <PageHeader kicker="Your account" title={user.name} />
      <div className="grid gap-6 lg:grid-cols-[1fr_2fr]">
        <section className="card p-6 text-sm" aria-labelledby="profile-heading">
          <h2 id="profile-heading" className="text-lg font-bold">Profile</h2>
          <dl className="mt-3 space-y-2">
            <div>
              <dt className="text-ink-faint">E-mail</dt>
              <dd className="font-mono">{user.email}</dd>
              <dd data-testid="email-status">
                {confirmed ? 'Confirmed' : <>Not confirmed yet: reports cannot be sent to inspectors until you open the link we e-mailed.<ResendConfirmation email={user.email} /></>}
              </dd>
            </div>
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
      <section className="card mt-6 max-w-xl p-6" aria-labelledby="password-heading">
        <h2 id="password-heading" className="text-lg font-bold">Change password</h2>
        <div className="mt-3"><NewPasswordForm /></div>
      </section>
    </>
  );
}
