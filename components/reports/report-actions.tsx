'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

export function ReportActions({ checkId, inspectorEmail, canSend }: { checkId: string; inspectorEmail: string | null; canSend: boolean }) {
  const router = useRouter();
  const [to, setTo] = useState(inspectorEmail ?? '');
  const [note, setNote] = useState('');
  const [busy, setBusy] = useState(false);
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);

  async function send(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMsg(null);
    try {
      const res = await fetchJson<{ to: string; report: { code: string } }>(`/api/checks/${checkId}/send`, { method: 'POST', json: { to: to || undefined, note: note || undefined } });
      setMsg({ ok: true, text: `Report ${res.report.code} sent to ${res.to}.` });
      router.refresh();
    } catch (err) {
      const text = err instanceof ApiError && err.errors.length ? err.errors.map((x) => x.message).join(' ') : (err as Error).message;
      setMsg({ ok: false, text: `Not sent: ${text} The check and the report are kept; try again.` });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card no-print p-5" aria-labelledby="report-h">
      <h2 id="report-h" className="text-lg font-bold">Report for the inspector</h2>
      <p className="mt-1 text-sm text-ink-soft">A PDF citing every section checked, with the drawings, hinge layout and photos. Each copy gets its own code, verifiable online.</p>
      <a href={`/api/checks/${checkId}/report`} className="btn-secondary mt-3" data-testid="download-report">Download report (PDF)</a>
      {canSend && (
        <form onSubmit={send} className="mt-4 space-y-3" noValidate>
          <div>
            <label htmlFor="send-to" className="field-label">Inspector’s e-mail</label>
            <input id="send-to" type="email" className="field-input" value={to} onChange={(e) => setTo(e.target.value)} />
          </div>
          <div>
            <label htmlFor="send-note" className="field-label">Note (optional)</label>
            <textarea id="send-note" rows={2} className="field-input" value={note} onChange={(e) => setNote(e.target.value)} />
          </div>
          <button type="submit" className="btn-primary" disabled={busy}>{busy ? 'Sending…' : 'Send to inspector'}</button>
          {msg && <p role={msg.ok ? 'status' : 'alert'} className={`text-sm font-semibold ${msg.ok ? 'text-status-pass' : 'text-status-fail'}`} data-testid="send-result">{msg.text}</p>}
        </form>
      )}
    </section>
  );
}
