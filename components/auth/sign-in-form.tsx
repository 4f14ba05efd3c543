'use client';

import { signIn } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { safeCallbackPath } from '@/lib/platform/auth/callback-url';
import { signInErrorMessage } from '@/lib/platform/auth/sign-in-messages';

export function SignInForm({ callbackUrl }: { callbackUrl?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    const form = new FormData(e.currentTarget);
    try {
      const res = await signIn('credentials', {
        email: String(form.get('email') ?? ''),
        password: String(form.get('password') ?? ''),
        redirect: false,
      });
      if (res?.ok && !res.error) {
        // Checked again here: the page passes it on, but an open redirect after sign-in would help a phishing page.
        router.replace(safeCallbackPath(callbackUrl));
        router.refresh();
        return;
      }
      setError(signInErrorMessage(res?.error));
    } catch {
      setError('NookPass could not be reached. Check your connection and try again.');
    }
    setBusy(false);
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate aria-describedby={error ? 'sign-in-error' : undefined}>
      <div>
        <label htmlFor="email" className="field-label">E-mail</label>
        <input id="email" name="email" type="email" autoComplete="username" required className="field-input" />
      </div>
      <div>
        <label htmlFor="password" className="field-label">Password</label>
        <input id="password" name="password" type="password" autoComplete="current-password" required className="field-input" />
      </div>
      {error && (
        <p id="sign-in-error" role="alert" className="rounded-md bg-status-fail/10 px-3 py-2 text-sm text-status-fail">
          {error}
        </p>
      )}
      <button type="submit" className="btn-primary w-full" disabled={busy}>
        {busy ? 'Signing in…' : 'Sign in'}
      </button>
    </form>
  );
}
