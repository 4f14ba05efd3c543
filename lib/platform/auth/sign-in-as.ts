import 'server-only';
import { encode as encodeJwt } from 'next-auth/jwt';
import type { AppUser } from '@/lib/domain/roles';
import { SESSION_LIFETIME_SECONDS, remainingSeconds, startSession } from '@/lib/platform/auth/sessions';

/*
 * next-auth v4 names its JWT cookie `next-auth.session-token`, with the `__Secure-` prefix when the site is
 * served over https, and sets it HttpOnly, SameSite=Lax, Path=/ (its defaultCookies). A cookie made here
 * with the same name, options and encoding is read by next-auth exactly like one it set itself.
 */
function usesSecureCookies(): boolean {
  return (process.env.NEXTAUTH_URL ?? '').startsWith('https://');
}

export function sessionCookieName(): string {
  return `${usesSecureCookies() ? '__Secure-' : ''}next-auth.session-token`;
}

/**
 * Signs a person in from an API route, as the sign-in form does: a session row (revocable, seven days at
 * most) and next-auth's session cookie naming it. Returns the Set-Cookie header value to answer with.
 * Only for a person who has just proved who they are (signed up, accepted an invitation, reset a password).
 */
export async function signInAs(user: AppUser, request: Pick<Request, 'headers'>): Promise<string> {
  const secret = process.env.NEXTAUTH_SECRET;
  if (!secret) throw new Error('NEXTAUTH_SECRET is not set; sessions cannot be signed.');
  const session = await startSession(user.id, new Headers(request.headers));
  const maxAge = remainingSeconds(session.expiresAtSeconds, SESSION_LIFETIME_SECONDS);
  const jwt = await encodeJwt({
    secret,
    maxAge,
    token: { sub: user.id, name: user.name, email: user.email, uid: user.id, sid: session.id, sessionExpiresAt: session.expiresAtSeconds },
  });
  const expires = new Date(session.expiresAtSeconds * 1000).toUTCString();
  const parts = [`${sessionCookieName()}=${jwt}`, 'Path=/', `Expires=${expires}`, 'HttpOnly', 'SameSite=Lax'];
  if (usesSecureCookies()) parts.push('Secure');
  return parts.join('; ');
}

/** An answer that also signs the person in (JSON, or no body for 204). */
export function signedInResponse(body: unknown, status: number, cookie: string): Response {
  const headers = new Headers({ 'cache-control': 'no-store' });
  headers.append('set-cookie', cookie);
  if (body === null) return new Response(null, { status, headers });
  headers.set('content-type', 'application/json');
  return new Response(JSON.stringify(body), { status, headers });
}
