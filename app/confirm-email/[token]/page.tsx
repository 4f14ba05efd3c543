import type { Metadata } from 'next';
import Link from 'next/link';
import { AuthCard, FormAlert } from '@/components/auth/auth-card';
import { ConfirmEmailButton } from '@/components/auth/confirm-email-button';
import { getDb } from '@/db';
import { confirmationLinkState } from '@/lib/services/accounts/email-confirmation';

export const metadata: Metadata = { title: 'Confirm your e-mail address', referrer: 'no-referrer' };
export const dynamic = 'force-dynamic';

const STATES = {
  unknown: { title: 'This link is not valid', text: 'Check that the whole link was copied. Signed in, you can send a new one from the Account page.' },
  expired: { title: 'This link has expired', text: 'Confirmation links work for 7 days. Sign in and send a new one from the Account page.' },
  used: { title: 'This link was already used', text: 'The address was confirmed with it, or a newer link replaced it. The Account page shows whether your address is confirmed.' },
} as const;

export default async function ConfirmEmailPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const state = await confirmationLinkState(getDb(), token);
  if (state !== 'valid') {
    return (
      <AuthCard title={STATES[state].title}>
        <div className="space-y-4" data-link-state={state}>
          <FormAlert>{STATES[state].text}</FormAlert>
          <Link href="/account" className="btn-primary inline-block">Open the Account page</Link>
        </div>
      </AuthCard>
    );
  }
  return (
    <AuthCard title="Confirm your e-mail address" intro="One click, and your company can e-mail reports to inspectors.">
      <ConfirmEmailButton token={token} />
    </AuthCard>
  );
}
