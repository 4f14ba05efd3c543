import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

export const TOKEN_PREFIX = 'np_';

/** A new personal API token: shown once; only its hash is stored. */
export function generateApiToken(): { token: string; hash: string; displayPrefix: string } {
  const token = TOKEN_PREFIX + randomBytes(32).toString('base64url');
  return { token, hash: hashApiToken(token), displayPrefix: token.slice(0, 10) };
}

// The token carries 256 random bits, so a fast hash is enough; no salt is needed to stop guessing.
export function hashApiToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

export function looksLikeApiToken(value: string): boolean {
  return /^np_[A-Za-z0-9_-]{43}$/.test(value);
}

export function tokenMatches(token: string, storedHash: string): boolean {
  const a = Buffer.from(hashApiToken(token), 'hex');
  const b = Buffer.from(storedHash, 'hex');
  return a.length === b.length && timingSafeEqual(a, b);
}

export function bearerToken(request: Request): string | null {
  const header = request.headers.get('authorization');
  if (!header) return null;
  const m = /^Bearer\s+(\S+)\s*$/i.exec(header);
  return m ? m[1] : '';
}
