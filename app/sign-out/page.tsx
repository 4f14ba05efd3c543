import type { Metadata } from 'next';
import Link from 'next/link';
import { SignOutButton } from '@/components/auth/sign-out-button';
import { Wordmark } from '@/components/ui/logo';

export const metadata: Metadata = { title: 'Sign out' };

export default function SignOutPage() {
  return (
    <main id="main" className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-4 py-10">
      <Link href="/" className="self-start"><Wordmark /></Link>
      <div className="card mt-6 p-6">
        <h1 className="text-2xl font-bold">Sign out of NookPass?</h1>
        <p className="mt-2 text-sm text-ink-soft">Saved plans, checks and reports stay with your company. Your API tokens keep working until you revoke them on your account page.</p>
        <div className="mt-6 flex gap-3">
          <SignOutButton />
          <Link href="/home" className="btn-secondary">Stay signed in</Link>
        </div>
      </div>
    </main>
  );
}
