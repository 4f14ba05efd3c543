import { createHash, randomBytes } from 'node:crypto';

/*
 * Tokens sent by e-mail (password reset, address confirmation, invitation): 32 random bytes (256 bits, above
 * the 128 bits OWASP's Forgot Password Cheat Sheet asks for), base64url so they sit in a URL path as they are.
 * Only the SHA-256 is stored: a copy of the database cannot be used to reset anyone's password. The token is
 * random enough that a fast unsalted hash does not help guessing.
 */
const TOKEN_BYTES = 32;
const TOKEN_PATTERN = /^[A-Za-z0-9_-]{43}$/;

export type OneTimeToken = { token: string; hash: string };

export function newOneTimeToken(): OneTimeToken {
  const token = randomBytes(TOKEN_BYTES).toString('base64url');
  return { token, hash: hashOneTimeToken(token) };
}

export function hashOneTimeToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** A token of the shape we hand out; anything else is refused without a database lookup. */
export function looksLikeOneTimeToken(value: unknown): value is string {
  return typeof value === 'string' && TOKEN_PATTERN.test(value);
}
