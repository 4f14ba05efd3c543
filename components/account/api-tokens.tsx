'use client';

import { useState } from 'react';
import useSWR from 'swr';
import { DEFAULT_TOKEN_DAYS, TOKEN_LIFETIME_CHOICES } from '@/lib/platform/auth/api-token-form';
import { DEFAULT_TIME_ZONE, formatDate, formatDateTime } from '@/lib/domain/dates/format';

type Token = { id: string; name: string; prefix: string; createdAt: string; lastUsedAt: string | null; revokedAt: string | null; expiresAt: string; isExpired: boolean };

async function fetchJson<T>(url: string, init?: RequestInit): Promise<T> {
  const res = await fetch(url, init);
  const body = await res.json().catch(() => ({}));
  if (!res.ok) {
    const fieldMessage = body?.errors?.[0]?.message as string | undefined;
    throw new Error(fieldMessage ?? body?.error ?? `Request failed (${res.status}).`);
  }
  return body as T;
}

// An account belongs to no jurisdiction: its times are in UTC, labelled so.
const when = (iso: string | null) => (iso ? formatDateTime(iso, DEFAULT_TIME_ZONE) : 'never');
const day = (iso: string) => formatDate(iso, DEFAULT_TIME_ZONE);

export function ApiTokens() {
  const { data, error, isLoading, mutate } = useSWR('/api/tokens', (u: string) => fetchJson<{ tokens: Token[] }>(u));
  const [name, setName] = useState('');
  const [days, setDays] = useState<number>(DEFAULT_TOKEN_DAYS);
  const [fieldError, setFieldError] = useState<string | null>(null);
  const [fresh, setFresh] = useState<{ name: string; token: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function create(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setFieldError(null);
    try {
      const created = await fetchJson<{ token: string; name: string }>('/api/tokens', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ name, expiresInDays: days }),
      });
      setFresh({ name: created.name, token: created.token });
      setName('');
      await mutate();
    } catch (err) {
      setFieldError((err as Error).message);
    } finally {
      setBusy(false);
    }
  }

  async function revoke(id: string) {
    try {
      await fetchJson(`/api/tokens/${id}`, { method: 'DELETE' });
    } finally {
      await mutate();
    }
  }

  const live = data?.tokens.filter((t) => !t.revokedAt && !t.isExpired) ?? [];
  const expired = data?.tokens.filter((t) => !t.revokedAt && t.isExpired) ?? [];
  const revoked = data?.tokens.filter((t) => t.revokedAt) ?? [];

  return (
    <section aria-labelledby="tokens-heading" className="card p-6">
      <h2 id="tokens-heading" className="text-lg font-bold">Personal API tokens</h2>
      <p className="mt-1 text-sm text-ink-soft">
        A token lets a script call the NookPass API as you (<code className="font-mono">Authorization: Bearer …</code>).
        It is shown once; we keep only a hash of it. Every token ends after the lifetime you choose (one year at
        most), and only a signed-in browser can create one.
      </p>

      <form onSubmit={create} className="mt-4 flex flex-wrap items-end gap-3" noValidate>
        <div className="min-w-[16rem] flex-1">
          <label htmlFor="token-name" className="field-label">Token name</label>
          <input
            id="token-name"
            className="field-input"
            value={name}
            onChange={(e) => setName(e.target.value)}
            placeholder="e.g. estimating spreadsheet"
            aria-invalid={fieldError ? true : undefined}
            aria-describedby={fieldError ? 'token-name-error' : undefined}
          />
        </div>
        <div>
          <label htmlFor="token-lifetime" className="field-label">Expires after</label>
          <select id="token-lifetime" className="field-input" value={days} onChange={(e) => setDays(Number(e.target.value))}>
            {TOKEN_LIFETIME_CHOICES.map((c) => (
              <option key={c.days} value={c.days}>{c.label}</option>
            ))}
          </select>
        </div>
        <button type="submit" className="btn-primary" disabled={busy}>Create token</button>
        {fieldError && <p id="token-name-error" className="field-error w-full" role="alert">{fieldError}</p>}
      </form>

      {fresh && (
        <div className="mt-4 rounded-md border border-status-pass/40 bg-status-pass/10 p-4" role="status">
          <p className="text-sm font-semibold">Copy “{fresh.name}” now — it will not be shown again.</p>
          <code data-testid="new-token" className="mt-2 block break-all rounded bg-white px-3 py-2 font-mono text-sm">{fresh.token}</code>
        </div>
      )}

      <div className="mt-6">
        {isLoading && <p className="text-sm text-ink-soft">Loading tokens…</p>}
        {error && <p className="text-sm text-status-fail" role="alert">Could not load your tokens: {(error as Error).message}</p>}
        {data && live.length === 0 && <p className="text-sm text-ink-soft">No live tokens. Create one when a script or integration needs to reach the API.</p>}
        {live.length > 0 && (
          <ul className="divide-y divide-rule rounded-md border border-rule">
            {live.map((t) => (
              <li key={t.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3 text-sm">
                <div>
                  <div className="font-semibold">{t.name}</div>
                  <div className="font-mono text-xs text-ink-faint">{t.prefix}… · created {when(t.createdAt)} · last used {when(t.lastUsedAt)}</div>
                  <div className="text-xs text-ink-soft" data-testid="token-expiry">expires {day(t.expiresAt)}</div>
                </div>
                <button type="button" className="btn-danger" onClick={() => revoke(t.id)} aria-label={`Revoke token ${t.name}`}>
                  Revoke
                </button>
              </li>
            ))}
          </ul>
        )}
        {expired.length > 0 && (
          <details className="mt-4 text-sm">
            <summary className="cursor-pointer text-ink-soft">Expired tokens ({expired.length})</summary>
            <ul className="mt-2 space-y-1 text-ink-faint">
              {expired.map((t) => (
                <li key={t.id}>{t.name} <span className="font-mono text-xs">{t.prefix}…</span> — expired {day(t.expiresAt)}</li>
              ))}
            </ul>
          </details>
        )}
        {revoked.length > 0 && (
          <details className="mt-4 text-sm">
            <summary className="cursor-pointer text-ink-soft">Revoked tokens ({revoked.length})</summary>
            <ul className="mt-2 space-y-1 text-ink-faint">
              {revoked.map((t) => (
                <li key={t.id}>{t.name} <span className="font-mono text-xs">{t.prefix}…</span> — revoked {when(t.revokedAt)}</li>
              ))}
            </ul>
          </details>
        )}
      </div>
    </section>
  );
}
