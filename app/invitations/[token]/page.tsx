import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db';
import { AcceptInvitationForm } from '@/components/people/accept-invitation-form';
import { Wordmark } from '@/components/ui/logo';
import { invitationStateMessage, invitedRoleLabels } from '@/lib/domain/accounts/people';
import { describeInvitation } from '@/lib/services/accounts/invitations';
import { DEFAULT_TIME_ZONE, formatDateTime } from '@/lib/domain/dates/format';

export const metadata: Metadata = { title: 'Invitation', referrer: 'no-referrer' };
export const dynamic = 'force-dynamic';

export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invitation = await describeInvitation(getDb(), token);
  if (!invitation) notFound();
  const place = invitation.organizationName ?? invitation.jurisdictionName ?? 'NookPass administration';
  return (
    <main id="main" className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-4 py-10">
      <Link href="/" className="self-start"><Wordmark /></Link>
      <div className="card mt-6 p-6" data-testid="invitation" data-state={invitation.state}>
        {invitation.state === 'pending' ? (
          <>
            <h1 className="text-2xl font-bold">Join {place}</h1>
            <p className="mt-1 text-sm text-ink-soft">
              {invitation.invitedByEmail ?? 'Someone'} invited you as {invitedRoleLabels[invitation.role].toLowerCase()}. The invitation
              works until {formatDateTime(invitation.expiresAt, DEFAULT_TIME_ZONE)}.
            </p>
            <div className="mt-6">
              <AcceptInvitationForm token={token} email={invitation.email} />
            </div>
          </>
        ) : (
          <>
            <h1 className="text-2xl font-bold">{invitationStateMessage(invitation.state).title}</h1>
            <p className="mt-3 text-ink-soft">{invitationStateMessage(invitation.state).next}</p>
            <p className="mt-6 text-sm"><Link href="/sign-in" className="underline">Go to sign-in</Link></p>
          </>
        )}
      </div>
    </main>
  );
}
