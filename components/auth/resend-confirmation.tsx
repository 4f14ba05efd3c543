'use client';

import { useState } from 'react';
import { fetchJson } from '@/lib/platform/client/fetch-json';

/** "Resend confirmation": a fresh link to the signed-in person's address. */
export function ResendConfirmation({ email }: { email: string }) {
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function resend() {
    setBusy(true);
    setMessage(null);
    try {
      await fetchJson('/api/email-confirmations', { method: 'POST' });
      setMessage({ ok: true, text: `A new confirmation link is on its way to ${email}.` });
    } catch (err) {
      setMessage({ ok: false, text: (err as Error).message });
    }
    setBusy(false);
  }

  return (
    <div className="mt-2 flex flex-wrap items-center gap-3">
      <button type="button" className="btn-secondary" onClick={resend} disabled={busy}>{busy ? 'Sending…' : 'Resend confirmation'}</button>
      {message && <span role={message.ok ? 'status' : 'alert'} className={message.ok ? 'text-sm text-status-pass' : 'text-sm text-status-fail'}>{message.text}</span>}
    </div>
  );
}

/** The notice shown where a report would be sent, while the address is unconfirmed. */
export function UnconfirmedNotice({ email }: { email: string }) {
  return (
    <div className="rounded-md border border-brass bg-brass-soft/40 p-3 text-sm" data-testid="unconfirmed-notice">
      <p>
        <strong>Confirm your e-mail address to send reports to inspectors.</strong> Open the link we sent to{' '}
        <span className="font-mono">{email}</span>. Downloading reports and everything else works already.
      </p>
      <ResendConfirmation email={email} />
    </div>
  );
}
