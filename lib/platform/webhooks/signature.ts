import { createHmac, timingSafeEqual } from 'node:crypto';

/*
 * Every delivery carries `NookPass-Signature: t=<unix seconds>,v1=<hex HMAC-SHA256>` over "<t>.<raw body>" with
 * the endpoint's secret as the key (HMAC, RFC 2104; SHA-256, FIPS 180-4). Signing the time with the body lets a
 * receiver refuse an old delivery replayed later; a fresh time is signed on each attempt.
 */

export const SIGNATURE_HEADER = 'NookPass-Signature';
export const EVENT_ID_HEADER = 'NookPass-Event-Id';
export const EVENT_TYPE_HEADER = 'NookPass-Event-Type';

/** HMAC-SHA256 of `message` under `key`, as lowercase hex. */
export function hmacSha256Hex(key: string | Buffer, message: string | Buffer): string {
  return createHmac('sha256', key).update(message).digest('hex');
}

/** The signature header's value for one delivery attempt. */
export function signWebhookBody(secret: string, rawBody: string, timestampSeconds: number): string {
  if (!Number.isInteger(timestampSeconds) || timestampSeconds < 0) throw new RangeError('The signing time is whole seconds since 1970.');
  return `t=${timestampSeconds},v1=${hmacSha256Hex(secret, `${timestampSeconds}.${rawBody}`)}`;
}

/**
 * What a receiver does (and what our tests do): parse the header, recompute the HMAC over "<t>.<raw body>",
 * compare in constant time, and refuse a time more than `toleranceSeconds` away from now.
 */
export function verifyWebhookSignature(
  secret: string,
  rawBody: string,
  header: string | null | undefined,
  opts: { nowSeconds?: number; toleranceSeconds?: number } = {},
): { ok: true; timestamp: number } | { ok: false; reason: string } {
  if (!header) return { ok: false, reason: 'no signature header' };
  const parts = new Map<string, string[]>();
  for (const item of header.split(',')) {
    const eq = item.indexOf('=');
    if (eq <= 0) continue;
    const k = item.slice(0, eq).trim();
    parts.set(k, [...(parts.get(k) ?? []), item.slice(eq + 1).trim()]);
  }
  const t = parts.get('t')?.[0];
  if (!t || !/^\d{1,12}$/.test(t)) return { ok: false, reason: 'no timestamp' };
  const timestamp = Number(t);
  const now = opts.nowSeconds ?? Math.floor(Date.now() / 1000);
  if (Math.abs(now - timestamp) > (opts.toleranceSeconds ?? 300)) return { ok: false, reason: 'timestamp outside the tolerance' };
  const expected = Buffer.from(hmacSha256Hex(secret, `${t}.${rawBody}`), 'hex');
  for (const v1 of parts.get('v1') ?? []) {
    if (!/^[0-9a-f]{64}$/.test(v1)) continue;
    if (timingSafeEqual(expected, Buffer.from(v1, 'hex'))) return { ok: true, timestamp };
  }
  return { ok: false, reason: 'signature does not match' };
}
