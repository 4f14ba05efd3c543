import type { Metadata } from 'next';
import Link from 'next/link';
import { SignInForm } from '@/components/auth/sign-in-form';
import { Wordmark } from '@/components/ui/logo';
import { demoUsers } from '@/db/demo';
import { safeCallbackPath } from '@/lib/platform/auth/callback-url';

export const metadata: Metadata = { title: 'Sign in' };
export const dynamic = 'force-dynamic';

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string | string[]; error?: string; notice?: string }> }) {
  const { callbackUrl, notice } = await searchParams;
  const isDemo = process.env.NOOKPASS_DEMO === '1';
  return (
    <main id="main" className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-4 py-10">
      <Link href="/" className="self-start"><Wordmark /></Link>
      <div className="card mt-6 p-6">
        <h1 className="text-2xl font-bold">Sign in</h1>
        <p className="mt-1 text-sm text-ink-soft">Use the e-mail your company or jurisdiction registered.</p>
        {notice === 'password-reset' && (
          <p role="status" className="mt-4 rounded-md bg-status-pass/10 px-3 py-2 text-sm text-status-pass">
            Your password is changed and every session of yours has ended. Sign in with the new password.
          </p>
        )}
        <div className="mt-6">
          <SignInForm callbackUrl={safeCallbackPath(callbackUrl)} />
        </div>
        <p className="mt-4 text-sm"><Link href="/forgot-password" className="underline">Forgot your password?</Link></p>
      </div>
      <p className="mt-4 text-sm text-ink-soft">New installer company? <Link href="/sign-up" className="underline">Sign up your company</Link>.</p>
      {isDemo && (
        <section aria-labelledby="demo-heading" className="mt-6 rounded-lg border border-dashed border-brass bg-brass-soft/40 p-4 text-sm">
          <h2 id="demo-heading" className="font-semibold">Demo data</h2>
          <p className="mt-1 text-ink-soft">
            This server runs the invented demo scenario. Password: <code className="font-mono">{process.env.NOOKPASS_DEMO_PASSWORD ? '(set by NOOKPASS_DEMO_PASSWORD)' : 'demo-password'}</code>
          </p>
          <ul className="mt-2 space-y-1 font-mono text-xs">
            {demoUsers.map((u) => (
              <li key={u.email}>{u.email} <span className="text-ink-faint">— {u.role}</span></li>
            ))}
          </ul>
        </section>
      )}
    </main>
  );
}
