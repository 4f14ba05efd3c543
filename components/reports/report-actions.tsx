'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';
import { NOTE_MAX_CHARS, sendSchema } from '@/lib/domain/reports/send-schema';
import { UnconfirmedNotice } from '@/components/auth/resend-confirmation';

type Sent = { to: string; toInspector: boolean; report: { code: string } };

/** `unconfirmedEmail`: the sender's address while it is unconfirmed; sending then waits for the confirmation. */
export function ReportActions({ checkId, inspectorEmail, canSend, unconfirmedEmail = null }: { checkId: string; inspectorEmail: string | null; canSend: boolean; unconfirmedEmail?: string | null }) {
  const router = useRouter();
  const [to, setTo] = useState(inspectorEmail ?? '');
  const [note, setNote] = useState('');
  const [busy, setBusy] = useState(false);
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);
  const [fieldErrors, setFieldErrors] = useState<{ to?: string; note?: string }>({});
  // Set when the API asks to confirm an address that is neither the inspector's nor one used before.
  const [confirming, setConfirming] = useState<{ to: string; text: string } | null>(null);

  async function send(confirm: boolean) {
    setMsg(null);
    setFieldErrors({});
    // The same schema the API parses, checked here first so the message sits next to its field.
    const parsed = sendSchema.safeParse({ to: to.trim() || undefined, note: note || undefined, confirm: confirm || undefined });
    if (!parsed.success) {
      setFieldErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])));
      return;
    }
    setBusy(true);
    try {
      const res = await fetchJson<Sent>(`/api/checks/${checkId}/send`, { method: 'POST', json: parsed.data });
      setConfirming(null);
      setMsg({
        ok: true,
        text: `Report ${res.report.code} sent to ${res.to}.` + (res.toInspector
          ? ' It is in the inspector’s queue in NookPass.'
          : ' It went by e-mail only: the inspector’s queue in NookPass takes reports sent to the inspector address.'),
      });
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.status === 409 && err.errors[0]?.path === 'to') {
        setConfirming({ to: parsed.data.to ?? to, text: err.message });
      } else if (err instanceof ApiError && err.errors.some((e) => e.path === 'to' || e.path === 'note')) {
        setFieldErrors(Object.fromEntries(err.errors.map((e) => [e.path, e.message])));
      } else {
        const text = err instanceof ApiError && err.errors.length ? err.errors.map((x) => x.message).join(' ') : (err as Error).message;
        setMsg({ ok: false, text: `Not sent: ${text} The check and the report are kept; try again.` });
      }
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card no-print p-5" aria-labelledby="report-h">
      <h2 id="report-h" className="text-lg font-bold">Report for the inspector</h2>
      <p className="mt-1 text-sm text-ink-soft">A PDF citing every section checked, with the drawings, hinge layout and photos. Each copy gets its own code, verifiable online.</p>
      <form method="post" action={`/api/checks/${checkId}/report`}>
        {/* Issuing records a report, so it is a form POST; the answer is the PDF as a download. */}
        <button type="submit" className="btn-secondary mt-3" data-testid="download-report">Download report (PDF)</button>
      </form>
      {canSend && unconfirmedEmail && <div className="mt-4"><UnconfirmedNotice email={unconfirmedEmail} /></div>}
      {canSend && !unconfirmedEmail && (
        <form onSubmit={(e) => { e.preventDefault(); void send(false); }} className="mt-4 space-y-3" noValidate>
          <div>
            <label htmlFor="send-to" className="field-label">Inspector’s e-mail</label>
            <input
              id="send-to"
              type="email"
              className="field-input"
              value={to}
              onChange={(e) => { setTo(e.target.value); setConfirming(null); }}
              aria-invalid={!!fieldErrors.to}
              aria-describedby={fieldErrors.to ? 'send-to-hint send-to-error' : 'send-to-hint'}
            />
            <p id="send-to-hint" className="mt-1 text-xs text-ink-soft">
              Reports sent to the jurisdiction’s inspector address{inspectorEmail ? ` (${inspectorEmail})` : ''} appear in the inspector’s
              queue in NookPass. Any other address gets the e-mail only, and one your company has not used before asks you to confirm.
            </p>
            {fieldErrors.to && <p id="send-to-error" className="mt-1 text-sm text-status-fail">{fieldErrors.to}</p>}
          </div>
          <div>
            <label htmlFor="send-note" className="field-label">Note (optional)</label>
            <textarea
              id="send-note"
              rows={2}
              className="field-input"
              value={note}
              maxLength={NOTE_MAX_CHARS}
              onChange={(e) => setNote(e.target.value)}
              aria-invalid={!!fieldErrors.note}
              aria-describedby={fieldErrors.note ? 'send-note-count send-note-error' : 'send-note-count'}
            />
            <p id="send-note-count" className="mt-1 text-xs text-ink-soft">{note.length.toLocaleString('en-US')} of {NOTE_MAX_CHARS.toLocaleString('en-US')} characters</p>
            {fieldErrors.note && <p id="send-note-error" className="mt-1 text-sm text-status-fail">{fieldErrors.note}</p>}
          </div>
          {confirming ? (
            <div role="alert" className="rounded-md border border-status-caution/60 bg-status-caution/10 p-4 text-sm" data-testid="send-confirm">
              <p className="font-semibold">Send this report to {confirming.to}?</p>
              <p className="mt-1">{confirming.text}</p>
              <div className="mt-3 flex flex-wrap gap-2">
                <button type="button" className="btn-primary" disabled={busy} onClick={() => void send(true)}>{busy ? 'Sending…' : `Send to ${confirming.to}`}</button>
                <button type="button" className="btn-secondary" disabled={busy} onClick={() => setConfirming(null)}>Cancel</button>
              </div>
            </div>
          ) : (
            <button type="submit" className="btn-primary" disabled={busy}>{busy ? 'Sending…' : 'Send to inspector'}</button>
          )}
          {msg && <p role={msg.ok ? 'status' : 'alert'} className={`text-sm font-semibold ${msg.ok ? 'text-status-pass' : 'text-status-fail'}`} data-testid="send-result">{msg.text}</p>}
        </form>
      )}
    </section>
  );
}
