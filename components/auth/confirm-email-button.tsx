'use client';

import Link from 'next/link';
import { useState } from 'react';
import { FormAlert } from '@/components/auth/auth-card';
import { fetchJson } from '@/lib/platform/client/fetch-json';

/** Confirming takes a click, so a mail scanner that follows the link does not spend it. */
export function ConfirmEmailButton({ token }: { token: string }) {
  const [state, setState] = useState<{ kind: 'idle' | 'busy' | 'done' } | { kind: 'error'; message: string }>({ kind: 'idle' });

  async function confirm() {
    setState({ kind: 'busy' });
    try {
      await fetchJson(`/api/email-confirmations/${encodeURIComponent(token)}`, { method: 'POST' });
      setState({ kind: 'done' });
    } catch (err) {
      setState({ kind: 'error', message: (err as Error).message });
    }
  }

  if (state.kind === 'done') {
    return (
      <div className="space-y-3">
        <FormAlert tone="pass">Your e-mail address is confirmed. Your company can now send reports to inspectors.</FormAlert>
        <Link href="/projects" className="btn-primary inline-block">Go to your projects</Link>
      </div>
    );
  }
  return (
    <div className="space-y-3">
      {state.kind === 'error' && <FormAlert>{state.message}</FormAlert>}
      <button type="button" className="btn-primary" onClick={confirm} disabled={state.kind === 'busy'}>
        {state.kind === 'busy' ? 'Confirming…' : 'Confirm my e-mail address'}
      </button>
    </div>
  );
}
