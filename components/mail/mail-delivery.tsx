'use client';

import { useEffect, useState } from 'react';
import { BusyButton } from '@/components/busy-button';
import { mailState, type MailDeliveryProps } from '@/lib/domain/mail/outbox';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

const POLL_MS = 3_000;
// A page left open does not poll forever; a reload shows the latest state.
const POLL_FOR_MS = 10 * 60_000;

/**
 * One e-mail's delivery beside what caused it: queued → sent, or failed, retrying (n), and after the last
 * attempt a "Send again" button. While the message is on its way the state is read again every few seconds.
 */
export function MailDelivery({ initial, label = 'E-mail' }: { initial: MailDeliveryProps; label?: string }) {
  const [mail, setMail] = useState(initial);
  const [error, setError] = useState<string | null>(null);
  const pending = mail.status === 'queued' || mail.status === 'sending' || mail.status === 'retrying';

  useEffect(() => {
    if (!pending) return;
    const started = Date.now();
    const timer = setInterval(async () => {
      if (Date.now() - started > POLL_FOR_MS) return clearInterval(timer);
      try {
        setMail(await fetchJson<MailDeliveryProps>(`/api/mail/${mail.id}`));
      } catch {
        // The next tick tries again; a page that cannot reach the server shows the last state it knew.
      }
    }, POLL_MS);
    return () => clearInterval(timer);
  }, [pending, mail.id]);

  const state = mailState(mail);
  const tone = state.tone === 'done' ? 'text-status-pass' : state.tone === 'problem' ? 'text-status-fail' : 'text-ink-soft';
  return (
    <span className="inline-flex flex-wrap items-center gap-2" data-testid="mail-delivery" data-mail-id={mail.id} data-mail-status={mail.status}>
      <span className={`font-semibold ${tone}`} role="status">
        {label}: {state.label}
      </span>
      {mail.lastError && mail.status !== 'sent' && <span className="text-ink-soft">({mail.lastError})</span>}
      {state.canSendAgain && (
        <BusyButton
          className="btn-secondary"
          busyText="Queuing…"
          onClick={async () => {
            setError(null);
            try {
              setMail(await fetchJson<MailDeliveryProps>(`/api/mail/${mail.id}/send-again`, { method: 'POST' }));
            } catch (err) {
              setError(err instanceof ApiError ? err.message : 'The message could not be queued again; try again in a moment.');
            }
          }}
        >
          Send again
        </BusyButton>
      )}
      {error && <span className="text-status-fail" role="alert">{error}</span>}
    </span>
  );
}

