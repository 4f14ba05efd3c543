import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { hashOneTimeToken, looksLikeOneTimeToken, newOneTimeToken } from '@/lib/platform/auth/one-time-token';

describe('single-use e-mail tokens', () => {
  it('carry 256 random bits, base64url, safe in a URL path', () => {
    const { token } = newOneTimeToken();
    expect(Buffer.from(token, 'base64url').length * 8).toBe(256); // at least 128 bits: OWASP Forgot Password Cheat Sheet
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/); // RFC 4648 section 5 alphabet, no padding
    expect(encodeURIComponent(token)).toBe(token);
  });

  it('are stored as their SHA-256 only', () => {
    const { token, hash } = newOneTimeToken();
    expect(hash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(hash).not.toContain(token);
    expect(hashOneTimeToken(token)).toBe(hash);
    // FIPS 180-4 test vector for "abc".
    expect(hashOneTimeToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('differ every time', () => {
    const seen = new Set(Array.from({ length: 200 }, () => newOneTimeToken().token));
    expect(seen.size).toBe(200);
  });

  it('recognise only their own shape', () => {
    expect(looksLikeOneTimeToken(newOneTimeToken().token)).toBe(true);
    for (const bad of ['', 'abc', 'x'.repeat(44), '../../etc/passwd', `${'a'.repeat(42)}=`, 42, null]) {
      expect(looksLikeOneTimeToken(bad)).toBe(false);
    }
  });
});
