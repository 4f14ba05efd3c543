import type { Metadata } from 'next';
import Link from 'next/link';
import { AuthCard, FormAlert } from '@/components/auth/auth-card';
import { NewPasswordForm } from '@/components/auth/new-password-form';
import { getDb } from '@/db';
import { RESET_LINK_MESSAGES, passwordResetLinkState } from '@/lib/services/accounts/passwords';

export const metadata: Metadata = { title: 'Choose a new password', referrer: 'no-referrer' };
export const dynamic = 'force-dynamic';

const TITLES = { unknown: 'This link is not valid', expired: 'This link has expired', used: 'This link was already used' } as const;

export default async function ResetPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const state = await passwordResetLinkState(getDb(), token);
  if (state !== 'valid') {
    return (
      <AuthCard title={TITLES[state]} footer={<Link href="/sign-in" className="underline">Back to sign in</Link>}>
        <div className="space-y-4" data-link-state={state}>
          <FormAlert>{RESET_LINK_MESSAGES[state]}</FormAlert>
          <Link href="/forgot-password" className="btn-primary inline-block">Ask for a new link</Link>
        </div>
      </AuthCard>
    );
  }
  return (
    <AuthCard title="Choose a new password">
      <NewPasswordForm token={token} />
    </AuthCard>
  );
}
