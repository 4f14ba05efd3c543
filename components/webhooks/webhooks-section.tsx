'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { BusyButton } from '@/components/busy-button';
import { DEFAULT_TIME_ZONE, formatDateTime } from '@/lib/domain/dates/format';
import { WEBHOOK_EVENT_TYPES, webhookDeliveryState, webhookEventLabels, type WebhookDeliveryStatus, type WebhookEventType } from '@/lib/domain/webhooks/events';
import { webhookCreateSchema, type WebhookCreateInput } from '@/lib/domain/webhooks/schema';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

export type WebhookEndpointView = { id: string; url: string; events: WebhookEventType[]; active: boolean; createdAt: string; createdBy: string | null };
export type WebhookDeliveryView = {
  id: string;
  endpointId: string;
  eventType: WebhookEventType;
  status: WebhookDeliveryStatus;
  attempts: number;
  maxAttempts: number;
  lastResponseStatus: number | null;
  lastError: string | null;
  createdAt: string;
};

const POLL_MS = 3_000;
// A page left open does not poll forever; a reload shows the latest state.
const POLL_FOR_MS = 10 * 60_000;
// No jurisdiction owns the company page: its dates are UTC, and say so.
const when = (iso: string) => formatDateTime(iso, DEFAULT_TIME_ZONE);

/** A signing secret shown once, after it is made. */
function SecretOnce({ secret, url, onDone }: { secret: string; url: string; onDone: () => void }) {
  return (
    <div role="status" className="mt-4 rounded-md border border-brass/60 bg-paper-deep p-4 text-sm" data-testid="webhook-secret-box">
      <p className="font-semibold">Signing secret for {url}</p>
      <p className="mt-1 text-ink-soft">Copy it now into the receiver: it is not shown again. Rotate it below if it is lost or leaks.</p>
      <code className="mt-2 block break-all rounded bg-white px-2 py-1 font-mono text-sm" data-testid="webhook-secret">{secret}</code>
      <button type="button" className="btn-secondary mt-3" onClick={onDone}>I have copied it</button>
    </div>
  );
}

function AddEndpointForm({ onCreated }: { onCreated: (secret: string, url: string) => void }) {
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<WebhookCreateInput>({ resolver: zodResolver(webhookCreateSchema), defaultValues: { url: '', events: [...WEBHOOK_EVENT_TYPES] } });

  async function onSubmit(values: WebhookCreateInput) {
    setFormError(null);
    try {
      const created = await fetchJson<{ secret: string; url: string }>('/api/webhooks', { method: 'POST', json: values });
      reset({ url: '', events: [...WEBHOOK_EVENT_TYPES] });
      onCreated(created.secret, created.url);
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        for (const e of err.errors) setError((e.path.startsWith('events') ? 'events' : e.path) as keyof WebhookCreateInput, { message: e.message });
      } else setFormError((err as Error).message);
    }
  }

  return (
    <form onSubmit={handleSubmit(onSubmit)} className="mt-4 space-y-4" noValidate aria-labelledby="webhook-add-heading">
      <h3 id="webhook-add-heading" className="text-base font-bold">Add an endpoint</h3>
      <div>
        <label htmlFor="webhook-url" className="field-label">Endpoint address</label>
        <input
          {...register('url')}
          id="webhook-url"
          type="url"
          inputMode="url"
          className="field-input"
          placeholder="https://"
          autoComplete="off"
          aria-invalid={errors.url ? true : undefined}
          aria-describedby={errors.url ? 'webhook-url-error webhook-url-help' : 'webhook-url-help'}
        />
        <p id="webhook-url-help" className="mt-1 text-sm text-ink-soft">An https:// address on the public internet that accepts a POST with a JSON body.</p>
        {errors.url && <p id="webhook-url-error" className="field-error" role="alert">{errors.url.message}</p>}
      </div>
      <fieldset aria-describedby={errors.events ? 'webhook-events-error' : undefined}>
        <legend className="field-label">Events</legend>
        <div className="mt-1 space-y-1">
          {WEBHOOK_EVENT_TYPES.map((type) => (
            <label key={type} className="flex min-h-[44px] items-center gap-2 text-sm">
              <input {...register('events')} type="checkbox" value={type} className="h-5 w-5" />
              {webhookEventLabels[type]} <span className="font-mono text-xs text-ink-soft">{type}</span>
            </label>
          ))}
        </div>
        {errors.events && <p id="webhook-events-error" className="field-error" role="alert">{errors.events.message ?? errors.events.root?.message}</p>}
      </fieldset>
      <button type="submit" className="btn-primary" disabled={isSubmitting}>{isSubmitting ? 'Adding…' : 'Add endpoint'}</button>
      {formError && <p role="alert" className="text-sm text-status-fail">{formError}</p>}
    </form>
  );
}

function DeliveriesTable({ endpoint, deliveries, editable, onChanged }: { endpoint: WebhookEndpointView; deliveries: WebhookDeliveryView[]; editable: boolean; onChanged: (message: string | null, error?: string) => void }) {
  const caption = `Recent deliveries to ${endpoint.url}`;
  if (deliveries.length === 0) return <p className="mt-3 text-sm text-ink-soft">No deliveries yet.</p>;
  return (
    // Focusable so a keyboard can scroll the table on a phone.
    <div className="mt-3 overflow-x-auto rounded-md border border-rule" tabIndex={0} role="region" aria-label={caption}>
      <table className="min-w-full text-sm" data-testid="webhook-deliveries">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper-deep text-left text-xs uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2">Event</th>
            <th scope="col" className="px-3 py-2">Queued (UTC)</th>
            <th scope="col" className="px-3 py-2">Status</th>
            <th scope="col" className="px-3 py-2">Response</th>
            <th scope="col" className="px-3 py-2">Attempts</th>
            {editable && <th scope="col" className="px-3 py-2"><span className="sr-only">Actions</span></th>}
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {deliveries.map((d) => {
            const state = webhookDeliveryState(d);
            const tone = state.tone === 'done' ? 'text-status-pass' : state.tone === 'problem' ? 'text-status-fail' : 'text-ink-soft';
            return (
              <tr key={d.id} data-testid="webhook-delivery" data-status={d.status}>
                <td className="px-3 py-2 font-mono text-xs">{d.eventType}</td>
                <td className="px-3 py-2 whitespace-nowrap">{when(d.createdAt)}</td>
                <td className="px-3 py-2">
                  <span className={`font-semibold ${tone}`}>{state.label}</span>
                  {d.lastError && d.status !== 'delivered' && <span className="block text-xs text-ink-soft">{d.lastError}</span>}
                </td>
                <td className="px-3 py-2">{d.lastResponseStatus ?? '—'}</td>
                <td className="px-3 py-2">{d.attempts} of {d.maxAttempts}</td>
                {editable && (
                  <td className="px-3 py-2">
                    {state.canSendAgain && (
                      <BusyButton
                        className="btn-secondary"
                        busyText="Queuing…"
                        aria-label={`Send again the ${d.eventType} delivery queued ${when(d.createdAt)}`}
                        onClick={async () => {
                          try {
                            await fetchJson(`/api/webhook-deliveries/${d.id}/send-again`, { method: 'POST' });
                            onChanged('Queued again.');
                          } catch (err) {
                            onChanged(null, err instanceof ApiError ? err.message : 'The delivery could not be queued again; try again in a moment.');
                          }
                        }}
                      >
                        Send again
                      </BusyButton>
                    )}
                  </td>
                )}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

/**
 * The company's webhooks on its settings page: every installer of the company sees the endpoints and their
 * recent deliveries; owners add, rotate, turn off and on, remove, and send a failed delivery again.
 */
export function WebhooksSection({ endpoints, deliveries, editable }: { endpoints: WebhookEndpointView[]; deliveries: WebhookDeliveryView[]; editable: boolean }) {
  const router = useRouter();
  const [secret, setSecret] = useState<{ secret: string; url: string } | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const pending = deliveries.some((d) => d.status === 'queued' || d.status === 'sending' || d.status === 'retrying');

  useEffect(() => {
    if (!pending) return;
    const started = Date.now();
    const timer = setInterval(() => {
      if (Date.now() - started > POLL_FOR_MS) return clearInterval(timer);
      router.refresh();
    }, POLL_MS);
    return () => clearInterval(timer);
  }, [pending, router]);

  const changed = (done: string | null, problem?: string) => {
    setMessage(done);
    setError(problem ?? null);
    router.refresh();
  };

  async function act(what: () => Promise<string>) {
    try {
      changed(await what());
    } catch (err) {
      setMessage(null);
      setError(err instanceof ApiError ? err.message : 'That did not work; try again in a moment.');
    }
  }

  return (
    <section aria-labelledby="webhooks-heading" className="card mt-8 p-6" data-testid="webhooks-section">
      <h2 id="webhooks-heading" className="text-lg font-bold">Webhooks</h2>
      <p className="mt-1 max-w-3xl text-sm text-ink-soft">
        NookPass posts a signed JSON message to each endpoint when a report is sent to the inspector or an inspector records
        an outcome, and tries again for a while if the endpoint does not answer with a 2xx status. The header
        <span className="font-mono"> NookPass-Signature</span> carries an HMAC-SHA256 of the time and the body under the
        endpoint’s secret; check it before trusting a message. Times are UTC.
      </p>
      {!editable && <p className="mt-2 text-sm text-ink-soft" role="status">Only an owner of the company can add or change endpoints.</p>}
      {secret && <SecretOnce secret={secret.secret} url={secret.url} onDone={() => setSecret(null)} />}
      {message && <p role="status" className="mt-3 text-sm text-status-pass">{message}</p>}
      {error && <p role="alert" className="mt-3 text-sm text-status-fail">{error}</p>}

      {endpoints.length === 0 ? (
        <p className="mt-4 text-sm text-ink-soft">No endpoints yet.</p>
      ) : (
        <ul className="mt-4 space-y-6" aria-label="Webhook endpoints">
          {endpoints.map((e) => (
            <li key={e.id} className="border-t border-rule pt-4" data-testid="webhook-endpoint" data-endpoint-id={e.id}>
              <h3 className="break-all font-mono text-sm font-semibold">{e.url}</h3>
              <p className="mt-1 text-sm">
                <span className={e.active ? 'font-semibold text-status-pass' : 'font-semibold text-status-fail'} data-testid="webhook-state">
                  {e.active ? 'Active' : 'Deactivated'}
                </span>
                {' · '}
                {e.events.map((t) => webhookEventLabels[t]).join(', ')}
                {' · '}added {when(e.createdAt)}
                {e.createdBy ? ` by ${e.createdBy}` : ''}
              </p>
              {editable && (
                <div className="mt-2 flex flex-wrap gap-2">
                  <BusyButton
                    className="btn-secondary"
                    busyText="Rotating…"
                    aria-label={`Rotate the signing secret of ${e.url}`}
                    onClick={() =>
                      act(async () => {
                        const rotated = await fetchJson<{ secret: string; url: string }>(`/api/webhooks/${e.id}/rotate-secret`, { method: 'POST' });
                        setSecret({ secret: rotated.secret, url: rotated.url });
                        return 'A new secret was made; the old one no longer signs anything.';
                      })
                    }
                  >
                    Rotate secret
                  </BusyButton>
                  <BusyButton
                    className="btn-secondary"
                    busyText={e.active ? 'Deactivating…' : 'Activating…'}
                    aria-label={`${e.active ? 'Deactivate' : 'Activate'} ${e.url}`}
                    onClick={() =>
                      act(async () => {
                        await fetchJson(`/api/webhooks/${e.id}`, { method: 'PATCH', json: { active: !e.active } });
                        return e.active ? 'Deactivated: nothing more is sent to it.' : 'Activated.';
                      })
                    }
                  >
                    {e.active ? 'Deactivate' : 'Activate'}
                  </BusyButton>
                  <BusyButton
                    className="btn-danger"
                    busyText="Removing…"
                    aria-label={`Remove ${e.url}`}
                    onClick={() =>
                      act(async () => {
                        const removed = await fetchJson<{ deleted: boolean }>(`/api/webhooks/${e.id}`, { method: 'DELETE' });
                        return removed.deleted ? 'Removed.' : 'It has deliveries on record, so it was deactivated instead; its deliveries stay listed.';
                      })
                    }
                  >
                    Remove
                  </BusyButton>
                </div>
              )}
              <DeliveriesTable endpoint={e} deliveries={deliveries.filter((d) => d.endpointId === e.id)} editable={editable} onChanged={changed} />
            </li>
          ))}
        </ul>
      )}

      {editable && <AddEndpointForm onCreated={(s, url) => { setSecret({ secret: s, url }); changed(null); }} />}
    </section>
  );
}
