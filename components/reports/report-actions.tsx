'use client';

import { useRouter } from 'next/navigation';
import { useRef, useState } from 'react';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';
import { NOTE_MAX_CHARS, sendSchema } from '@/lib/domain/reports/send-schema';
import { UnconfirmedNotice } from '@/components/auth/resend-confirmation';
import { BusyButton } from '@/components/busy-button';

type Sent = { to: string; toInspector: boolean; report: { code: string } };

const sameAddress = (a: string, b: string | null) => !!b && a.trim().toLowerCase() === b.trim().toLowerCase();

type Confirmed = { address: boolean; failing: boolean };
const NONE_CONFIRMED: Confirmed = { address: false, failing: false };

/**
 * `unconfirmedEmail`: the sender's address while it is unconfirmed; sending then waits for the confirmation.
 * `failing`: how many of the check's findings fail; the API asks to confirm sending such a check.
 */
export function ReportActions({
  checkId,
  inspectorEmail,
  jurisdictionName,
  failing = 0,
  hasInspectors = true,
  canSend,
  unconfirmedEmail = null,
}: {
  checkId: string;
  inspectorEmail: string | null;
  jurisdictionName: string;
  failing?: number;
  /** false: nobody reads the jurisdiction's queue in NookPass, so no outcome will be recorded here. */
  hasInspectors?: boolean;
  canSend: boolean;
  unconfirmedEmail?: string | null;
}) {
  const router = useRouter();
  const [to, setTo] = useState(inspectorEmail ?? '');
  const [note, setNote] = useState('');
  const [busy, setBusy] = useState(false);
  // A ref, not state: a second press landing before React re-renders must not send twice.
  const inFlight = useRef(false);
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);
  const [fieldErrors, setFieldErrors] = useState<{ to?: string; note?: string }>({});
  // Set when the API asks to confirm: failing findings first, then an address that is neither the
  // inspector's nor one used before. What was already confirmed is kept for the next question.
  const [confirming, setConfirming] = useState<{ reason: 'failing' | 'address'; to: string; text: string } | null>(null);
  const [confirmed, setConfirmed] = useState<Confirmed>(NONE_CONFIRMED);
  const typed = to.trim();
  const otherAddress = !!inspectorEmail && !!typed && !sameAddress(typed, inspectorEmail);

  function cancel() {
    setConfirming(null);
    setConfirmed(NONE_CONFIRMED);
  }

  async function send(ok: Confirmed) {
    if (inFlight.current) return;
    setMsg(null);
    setFieldErrors({});
    // The same schema the API parses, checked here first so the message sits next to its field.
    const parsed = sendSchema.safeParse({
      to: typed || undefined,
      note: note || undefined,
      confirm: ok.address || undefined,
      confirmFailingFindings: ok.failing || undefined,
    });
    if (!parsed.success) {
      setFieldErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])));
      return;
    }
    inFlight.current = true;
    setBusy(true);
    setConfirmed(ok);
    try {
      const res = await fetchJson<Sent>(`/api/checks/${checkId}/send`, { method: 'POST', json: parsed.data });
      setConfirming(null);
      setConfirmed(NONE_CONFIRMED);
      setMsg({
        ok: true,
        text: `Report ${res.report.code} sent to ${res.to}.` + (res.toInspector
          ? ' It is in the inspector’s queue in NookPass.'
          : ' It went by e-mail only: the inspector’s queue in NookPass takes reports sent to the inspector address.'),
      });
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.status === 409 && err.errors[0]?.path === 'confirmFailingFindings') {
        setConfirming({ reason: 'failing', to: parsed.data.to ?? to, text: err.message });
      } else if (err instanceof ApiError && err.status === 409 && err.errors[0]?.path === 'to') {
        setConfirming({ reason: 'address', to: parsed.data.to ?? to, text: err.message });
      } else if (err instanceof ApiError && err.errors.some((e) => e.path === 'to' || e.path === 'note')) {
        setFieldErrors(Object.fromEntries(err.errors.map((e) => [e.path, e.message])));
      } else {
        const text = err instanceof ApiError && err.errors.length ? err.errors.map((x) => x.message).join(' ') : (err as Error).message;
        setMsg({ ok: false, text: `Not sent: ${text} The check and the report are kept; try again.` });
      }
    } finally {
      inFlight.current = false;
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
        <form onSubmit={(e) => { e.preventDefault(); void send(NONE_CONFIRMED); }} className="mt-4 space-y-3" noValidate>
          {!inspectorEmail && (
            <p className="rounded-md border border-status-caution/60 bg-status-caution/10 p-3 text-sm" data-testid="no-inspector-address" id="send-no-inspector">
              {jurisdictionName} has no inspector address on file in NookPass. The report will go by e-mail only to the address you type
              below, and it will not reach an inspector’s queue here, so nobody can record an outcome on it in NookPass.
            </p>
          )}
          {inspectorEmail && !hasInspectors && (
            <p className="rounded-md border border-status-caution/60 bg-status-caution/10 p-3 text-sm" data-testid="no-inspector-account" id="send-no-inspector">
              {jurisdictionName} has no inspector working in NookPass yet. The report goes by e-mail to {inspectorEmail}; nobody will
              record an outcome on it here, so follow up with the jurisdiction directly.
            </p>
          )}
          <div>
            <label htmlFor="send-to" className="field-label">Inspector’s e-mail</label>
            <input
              id="send-to"
              type="email"
              className="field-input"
              value={to}
              onChange={(e) => { setTo(e.target.value); cancel(); }}
              aria-invalid={!!fieldErrors.to}
              aria-describedby={[
                (!inspectorEmail || !hasInspectors) && 'send-no-inspector',
                'send-to-hint',
                'send-to-other',
                fieldErrors.to && 'send-to-error',
              ].filter(Boolean).join(' ')}
            />
            {/* Said while typing, before the send: only the inspector address reaches the queue. */}
            <p id="send-to-other" aria-live="polite" className={otherAddress ? 'mt-1 text-sm font-semibold text-status-caution' : 'sr-only'} data-testid="send-to-other">
              {otherAddress
                ? `${typed} is not ${jurisdictionName}’s inspector address (${inspectorEmail}). The report will go by e-mail only and will not appear in the inspector’s queue in NookPass.`
                : ''}
            </p>
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
          {confirming?.reason === 'failing' ? (
            <div role="alert" className="rounded-md border border-status-fail/60 bg-status-fail/10 p-4 text-sm" data-testid="send-confirm-failing">
              <p className="font-semibold">
                Send a report with {failing || 'some'} failing finding{failing === 1 ? '' : 's'}?
              </p>
              <p className="mt-1">
                The inspector will see {failing === 1 ? 'it' : 'them'} in the report. Fixing the plan and running a new check first is
                usually quicker than a correction notice.
              </p>
              <div className="mt-3 flex flex-wrap gap-2">
                <BusyButton className="btn-primary" busy={busy} busyText="Sending…" onClick={() => void send({ ...confirmed, failing: true })}>
                  Send with failing findings
                </BusyButton>
                <button type="button" className="btn-secondary" disabled={busy} onClick={cancel}>Cancel</button>
              </div>
            </div>
          ) : confirming ? (
            <div role="alert" className="rounded-md border border-status-caution/60 bg-status-caution/10 p-4 text-sm" data-testid="send-confirm">
              <p className="font-semibold">Send this report to {confirming.to}?</p>
              <p className="mt-1">{confirming.text}</p>
              <div className="mt-3 flex flex-wrap gap-2">
                <BusyButton className="btn-primary" busy={busy} busyText="Sending…" onClick={() => void send({ ...confirmed, address: true })}>
                  {`Send to ${confirming.to}`}
                </BusyButton>
                <button type="button" className="btn-secondary" disabled={busy} onClick={cancel}>Cancel</button>
              </div>
            </div>
          ) : (
            <>
              {failing > 0 && (
                <p className="text-sm text-ink-soft" data-testid="send-failing-note">
                  This check has {failing} failing finding{failing === 1 ? '' : 's'}; you will be asked to confirm before it is sent.
                </p>
              )}
              <BusyButton type="submit" className="btn-primary" busy={busy} busyText="Sending…" data-testid="send-report">
                {inspectorEmail ? 'Send to inspector' : 'Send by e-mail'}
              </BusyButton>
            </>
          )}
          {msg && <p role={msg.ok ? 'status' : 'alert'} className={`text-sm font-semibold ${msg.ok ? 'text-status-pass' : 'text-status-fail'}`} data-testid="send-result">{msg.text}</p>}
        </form>
      )}
    </section>
  );
}
