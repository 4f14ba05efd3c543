import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { bearerToken, generateApiToken, hashApiToken, looksLikeApiToken, tokenMatches } from '@/lib/platform/auth/api-token';

describe('personal API tokens', () => {
  it('generates a prefixed 256-bit token and stores only its SHA-256', () => {
    const { token, hash, displayPrefix } = generateApiToken();
    expect(looksLikeApiToken(token)).toBe(true);
    // 32 random bytes are 43 base64url characters (RFC 4648 §5, no padding).
    expect(token.length).toBe(3 + 43);
    // The stored hash equals Node's own SHA-256 of the token (FIPS 180-4), hex encoded.
    expect(hash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(hash).not.toContain(token.slice(3));
    expect(token.startsWith(displayPrefix)).toBe(true);
  });

  it('hashes a known vector correctly', () => {
    // SHA-256("abc") from FIPS 180-2 appendix B.1.
    expect(hashApiToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('matches only its own hash', () => {
    const a = generateApiToken();
    const b = generateApiToken();
    expect(a.token).not.toBe(b.token);
    expect(tokenMatches(a.token, a.hash)).toBe(true);
    expect(tokenMatches(a.token, b.hash)).toBe(false);
  });

  it('reads the Bearer header', () => {
    const req = (v?: string) => new Request('http://x/', { headers: v ? { authorization: v } : {} });
    expect(bearerToken(req())).toBeNull();
    expect(bearerToken(req('Bearer np_abc'))).toBe('np_abc');
    expect(bearerToken(req('bearer   np_abc  '))).toBe('np_abc');
    expect(bearerToken(req('Basic dXNlcg=='))).toBe('');
  });

  it('rejects strings that are not tokens', () => {
    expect(looksLikeApiToken('np_short')).toBe(false);
    expect(looksLikeApiToken("np_' OR 1=1 --" + 'a'.repeat(30))).toBe(false);
  });
});
