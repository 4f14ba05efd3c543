'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';

/** "Sign out everywhere else": ends the account's other sessions; this browser stays signed in. */
export function SignOutOthers({ others }: { others: number }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ text: string; isError: boolean } | null>(null);

  async function signOutOthers() {
    setBusy(true);
    setMessage(null);
    try {
      const res = await fetch('/api/sessions/revoke-others', { method: 'POST' });
      const body = await res.json().catch(() => ({}));
      if (!res.ok) throw new Error(body?.error ?? `Request failed (${res.status}).`);
      setMessage({ text: body.revoked === 1 ? 'Signed out 1 other session.' : `Signed out ${body.revoked} other sessions.`, isError: false });
      router.refresh();
    } catch (err) {
      setMessage({ text: (err as Error).message, isError: true });
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="mt-4 flex flex-wrap items-center gap-3">
      <button type="button" className="btn-danger" onClick={signOutOthers} disabled={busy || others === 0}>
        {busy ? 'Signing out…' : 'Sign out everywhere else'}
      </button>
      {message && (
        <p role={message.isError ? 'alert' : 'status'} className={message.isError ? 'text-sm text-status-fail' : 'text-sm text-ink-soft'}>
          {message.text}
        </p>
      )}
    </div>
  );
}
