import 'server-only';
import { getDb } from '@/db';
import { createSession, findLiveSession, revokeSession, type LiveSession } from '@/db/sessions';
import { clientAddress } from '@/lib/platform/rate-limit';

/**
 * A session lasts seven days from sign-in, however active it is (absolute timeout, OWASP Session Management
 * Cheat Sheet; the length is common practice, no published source). The cookie, the JWT inside it and the
 * session row all end then; signing out or "sign out everywhere else" ends the row sooner.
 */
export const SESSION_LIFETIME_SECONDS = 7 * 24 * 3600;

/** Thrown inside next-auth's jwt callback: next-auth then answers with no session and clears the cookie. */
export class SessionEndedError extends Error {
  constructor() {
    super('The session was signed out or has expired.');
    this.name = 'SessionEndedError';
  }
}

/** Records a new session for a sign-in; `headers` are the sign-in request's. */
export async function startSession(userId: string, headers: Headers): Promise<{ id: string; expiresAtSeconds: number }> {
  const session = await createSession(getDb(), {
    userId,
    lifetimeMs: SESSION_LIFETIME_SECONDS * 1000,
    userAgent: headers.get('user-agent'),
    clientAddress: clientAddress({ headers }),
  });
  return { id: session.id, expiresAtSeconds: Math.floor(session.expiresAt.getTime() / 1000) };
}

/** The live session the cookie names, with its user as stored now; throws SessionEndedError otherwise. */
export async function requireLiveSession(sessionId: unknown, userId: unknown): Promise<LiveSession> {
  if (typeof sessionId !== 'string' || typeof userId !== 'string') throw new SessionEndedError();
  const live = await findLiveSession(getDb(), sessionId);
  if (!live || live.user.id !== userId) throw new SessionEndedError();
  return live;
}

export async function endSession(sessionId: unknown): Promise<void> {
  if (typeof sessionId === 'string') await revokeSession(getDb(), sessionId);
}

/** Seconds a JWT for this session may still live: never past the session's own expiry. */
export function remainingSeconds(expiresAtSeconds: unknown, maxAge: number, nowMs = Date.now()): number {
  if (typeof expiresAtSeconds !== 'number') return 0;
  return Math.max(0, Math.min(maxAge, expiresAtSeconds - Math.floor(nowMs / 1000)));
}

const SESSION_COOKIE = /^(__Secure-)?next-auth\.session-token(\.\d+)?=/;

/**
 * next-auth v4 answers every session read with a fresh session cookie that expires a full maxAge later (its
 * `updateAge` applies to database sessions only). The cookie set at sign-in already lasts exactly as long as
 * the session, so a re-issued one is dropped; a clearing cookie (empty value, for an ended session) is kept.
 */
export function withoutReissuedSessionCookie(response: Response): Response {
  const cookies = response.headers.getSetCookie();
  const reissued = cookies.filter((c) => SESSION_COOKIE.test(c) && !/^[^=]+=;/.test(c));
  if (reissued.length === 0) return response;
  const headers = new Headers(response.headers);
  headers.delete('set-cookie');
  for (const c of cookies) if (!reissued.includes(c)) headers.append('set-cookie', c);
  return new Response(response.body, { status: response.status, statusText: response.statusText, headers });
}
