import 'server-only';
import { lookup as dnsLookup, type LookupAddress } from 'node:dns';
import http from 'node:http';
import https from 'node:https';
import type { LookupFunction } from 'node:net';
import { addressProblem, localReceiversAllowed, webhookTargetProblem } from '@/lib/platform/webhooks/targets';

export type WebhookPostResult = { ok: true; status: number } | { ok: false; status: number | null; error: string };

export const WEBHOOK_TIMEOUT_MS = 10_000;

class RefusedTarget extends Error {}

/** Resolves like the system does, then refuses the connection if any address is one webhooks may not reach. */
function guardedLookup(allowLoopback: boolean): LookupFunction {
  return (hostname, options, callback) => {
    dnsLookup(hostname, { ...options, all: true }, (err, addresses: LookupAddress[]) => {
      if (err) return callback(err, '', 0);
      const refused = addresses.map((a) => addressProblem(a.address, allowLoopback)).find((p) => p !== null);
      if (refused) return callback(new RefusedTarget(`${hostname} resolves to an address webhooks may not reach. ${refused}`), '', 0);
      if (options.all) return (callback as unknown as (e: null, a: LookupAddress[]) => void)(null, addresses);
      callback(null, addresses[0].address, addresses[0].family);
    });
  };
}

function describeError(err: unknown): string {
  const e = err as NodeJS.ErrnoException;
  if (err instanceof RefusedTarget) return e.message;
  const code = e?.code ? ` (${e.code})` : '';
  return `${e?.message ?? String(err)}${code}`.slice(0, 300);
}

/**
 * One POST of a webhook body: a 10 s limit on the whole exchange, no redirects followed (a 3xx is an answer
 * like any other), the target checked before connecting and every resolved address checked as it connects.
 * The answer's body is read and dropped; only its status counts.
 */
export function postWebhook(url: string, body: string, headers: Record<string, string>, timeoutMs = WEBHOOK_TIMEOUT_MS): Promise<WebhookPostResult> {
  const allowLoopback = localReceiversAllowed();
  const problem = webhookTargetProblem(url, allowLoopback);
  if (problem) return Promise.resolve({ ok: false, status: null, error: problem });
  const target = new URL(url);
  const client = target.protocol === 'https:' ? https : http;
  const payload = Buffer.from(body, 'utf8');
  return new Promise((resolve) => {
    let settled = false;
    const finish = (r: WebhookPostResult) => {
      if (settled) return;
      settled = true;
      resolve(r);
    };
    const req = client.request(
      target,
      {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'content-length': String(payload.byteLength), 'user-agent': 'NookPass-Webhooks/1', ...headers },
        lookup: guardedLookup(allowLoopback),
        agent: false,
      },
      (res) => {
        const status = res.statusCode ?? 0;
        // Drain what the receiver says (up to the time limit) so the socket closes cleanly; the body is not kept.
        res.on('error', () => undefined);
        res.resume();
        if (status >= 200 && status < 300) return finish({ ok: true, status });
        const location = status >= 300 && status < 400 ? res.headers.location : undefined;
        finish({ ok: false, status, error: location ? `The endpoint answered ${status} (redirects are not followed).` : `The endpoint answered ${status}.` });
      },
    );
    // The limit covers the whole exchange: an answer that never ends is cut off too (its status already counted).
    const timer = setTimeout(() => {
      finish({ ok: false, status: null, error: `No answer within ${Math.round(timeoutMs / 1000)} s.` });
      req.destroy();
    }, timeoutMs);
    req.on('close', () => clearTimeout(timer));
    req.on('error', (err) => finish({ ok: false, status: null, error: describeError(err) }));
    req.end(payload);
  });
}
