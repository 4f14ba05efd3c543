import { createHmac } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { hmacSha256Hex, signWebhookBody, verifyWebhookSignature } from '@/lib/platform/webhooks/signature';

describe('HMAC-SHA256 helper', () => {
  it('matches RFC 4231 test case 2 (key "Jefe")', () => {
    // RFC 4231 section 4.3, Test Case 2: HMAC-SHA-256.
    expect(hmacSha256Hex('Jefe', 'what do ya want for nothing?')).toBe('5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843');
  });

  it('matches RFC 4231 test case 1 (20 bytes of 0x0b)', () => {
    // RFC 4231 section 4.2, Test Case 1: HMAC-SHA-256.
    expect(hmacSha256Hex(Buffer.alloc(20, 0x0b), 'Hi There')).toBe('b0344c61d8db38535ca8afceaf0bf12b881dc200c9833da726e9376c2e32cff7');
  });
});

describe('the NookPass-Signature header', () => {
  const secret = 'whsec_test-key-for-the-signature-unit-test-000000';
  const body = '{"id":"6f1c3c5e-8d2a-4c1e-9a7b-0d4e5f6a7b8c","type":"report.sent","data":{"project":{"name":"Hall closet (demo) — ü"}}}';
  const t = 1_796_000_000;

  it('is t=<seconds>,v1=<hex HMAC-SHA256 of "<t>.<raw body>"> under the endpoint secret (RFC 2104), computed independently', () => {
    const expected = createHmac('sha256', Buffer.from(secret, 'utf8')).update(Buffer.from(`${t}.${body}`, 'utf8')).digest('hex');
    expect(signWebhookBody(secret, body, t)).toBe(`t=${t},v1=${expected}`);
    // Signed over the time too: another second gives another signature.
    expect(signWebhookBody(secret, body, t + 1)).not.toBe(`t=${t + 1},v1=${expected}`);
  });

  it('verifies as a receiver would, and refuses a changed body, another secret or an old time', () => {
    const header = signWebhookBody(secret, body, t);
    expect(verifyWebhookSignature(secret, body, header, { nowSeconds: t + 10 })).toEqual({ ok: true, timestamp: t });
    expect(verifyWebhookSignature(secret, body.replace('closet', 'cl0set'), header, { nowSeconds: t })).toMatchObject({ ok: false, reason: 'signature does not match' });
    expect(verifyWebhookSignature(`${secret}x`, body, header, { nowSeconds: t })).toMatchObject({ ok: false });
    expect(verifyWebhookSignature(secret, body, header, { nowSeconds: t + 301 })).toMatchObject({ ok: false, reason: 'timestamp outside the tolerance' });
    expect(verifyWebhookSignature(secret, body, header.replace(/^t=\d+/, `t=${t + 5}`), { nowSeconds: t })).toMatchObject({ ok: false });
    expect(verifyWebhookSignature(secret, body, null)).toMatchObject({ ok: false, reason: 'no signature header' });
    // A second v1 (a receiver mid-rotation may list several) is accepted when one matches.
    expect(verifyWebhookSignature(secret, body, `${header},v1=${'0'.repeat(64)}`, { nowSeconds: t }).ok).toBe(true);
  });

  it('refuses a signing time that is not whole seconds', () => {
    expect(() => signWebhookBody(secret, body, 1.5)).toThrow(RangeError);
  });
});
