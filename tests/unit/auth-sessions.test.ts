import { createRequire } from 'node:module';
import { join } from 'node:path';
import { decode, encode } from 'next-auth/jwt';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { authOptions } from '@/lib/platform/auth/options';
import { SESSION_LIFETIME_SECONDS, SessionEndedError, remainingSeconds, requireLiveSession, withoutReissuedSessionCookie } from '@/lib/platform/auth/sessions';

vi.mock('@/lib/platform/auth/sessions', async (importOriginal) => ({
  ...(await importOriginal<typeof import('@/lib/platform/auth/sessions')>()),
  requireLiveSession: vi.fn(),
}));

const SECRET = 'unit-test-secret-for-sessions';
const SID = '00000000-0000-4000-8000-0000000000aa';
const USER = { id: 'u-7', email: 'seven@example.test', name: 'Seven', role: 'installer' as const, organizationId: 'o-1', jurisdictionId: null, isOwner: false, isDemo: false };

const { AuthHandler } = createRequire(import.meta.url)(join(process.cwd(), 'node_modules/next-auth/core/index.js')) as {
  AuthHandler: (params: { req: Request; options: unknown }) => Promise<{ body?: unknown; cookies?: { name: string; value: string; options: { maxAge?: number; expires?: Date } }[] }>;
};

async function readSession(expiresInSeconds: number) {
  const sessionExpiresAt = Math.floor(Date.now() / 1000) + expiresInSeconds;
  const jwt = await encode({ token: { uid: USER.id, sid: SID, sessionExpiresAt }, secret: SECRET });
  const res = await AuthHandler({
    req: new Request('http://127.0.0.1:3000/api/auth/session', { headers: { cookie: `next-auth.session-token=${jwt}` } }),
    options: { ...authOptions, secret: SECRET },
  });
  return { res, sessionExpiresAt };
}

beforeEach(() => {
  vi.stubEnv('NEXTAUTH_URL', 'http://127.0.0.1:3000');
  vi.spyOn(console, 'error').mockImplementation(() => undefined);
});
afterEach(() => {
  vi.unstubAllEnvs();
  vi.restoreAllMocks();
});

describe('next-auth session reads check the session row', () => {
  it('answer a live session with the user as stored now and its absolute expiry, not now + maxAge', async () => {
    vi.mocked(requireLiveSession).mockResolvedValue({ id: SID, expiresAt: new Date(), user: USER });
    const { res, sessionExpiresAt } = await readSession(120);
    expect(requireLiveSession).toHaveBeenCalledWith(SID, USER.id);
    expect(res.body).toEqual({ user: { ...USER, sessionId: SID }, expires: new Date(sessionExpiresAt * 1000).toISOString() });
  });

  it('answer nothing for a signed-out or expired session and clear the cookie, without an error log line', async () => {
    vi.mocked(requireLiveSession).mockRejectedValue(new SessionEndedError());
    const { res } = await readSession(120);
    expect(res.body).toEqual({});
    const cleared = res.cookies?.find((c) => c.name === 'next-auth.session-token');
    expect(cleared?.value).toBe('');
    expect(console.error).not.toHaveBeenCalled();
  });

  it('keep the person signed in but unserved when the database does not answer', async () => {
    vi.mocked(requireLiveSession).mockRejectedValue(Object.assign(new Error('connect ECONNREFUSED'), { code: 'ECONNREFUSED' }));
    const { res } = await readSession(120);
    expect(res.body).toMatchObject({ unavailable: true });
    expect(res.cookies?.find((c) => c.name === 'next-auth.session-token')?.value).not.toBe('');
  });
});

describe('the session JWT', () => {
  it('never carries an exp past the session row, whatever maxAge next-auth asks for', async () => {
    const now = Math.floor(Date.now() / 1000);
    const jwt = await authOptions.jwt!.encode!({ token: { uid: 'u', sid: SID, sessionExpiresAt: now + 90 }, secret: SECRET, maxAge: SESSION_LIFETIME_SECONDS });
    const claims = await decode({ token: jwt, secret: SECRET });
    expect(claims!.exp).toBeGreaterThanOrEqual(now + 89);
    expect(claims!.exp).toBeLessThanOrEqual(now + 91);
  });

  it('lasts seven days at most (the absolute lifetime)', () => {
    expect(authOptions.session?.maxAge).toBe(7 * 24 * 3600);
    expect(remainingSeconds(2_000_000_000, SESSION_LIFETIME_SECONDS, 1_000_000_000_000)).toBe(SESSION_LIFETIME_SECONDS);
    expect(remainingSeconds(1_000_000_060, SESSION_LIFETIME_SECONDS, 1_000_000_000_000)).toBe(60);
    expect(remainingSeconds(999_999_000, SESSION_LIFETIME_SECONDS, 1_000_000_000_000)).toBe(0);
    expect(remainingSeconds(undefined, SESSION_LIFETIME_SECONDS)).toBe(0);
  });
});

describe('withoutReissuedSessionCookie', () => {
  it('drops a re-issued session cookie and keeps clearing cookies and other cookies', () => {
    const headers = new Headers({ 'content-type': 'application/json' });
    headers.append('set-cookie', 'next-auth.session-token=eyJfresh; Path=/; Expires=Thu, 10 Dec 2026 00:00:00 GMT; HttpOnly; SameSite=Lax');
    headers.append('set-cookie', '__Secure-next-auth.session-token.1=eyJmore; Path=/; HttpOnly; Secure; SameSite=Lax');
    headers.append('set-cookie', 'next-auth.csrf-token=abc; Path=/; HttpOnly; SameSite=Lax');
    const out = withoutReissuedSessionCookie(new Response('{}', { status: 200, headers }));
    expect(out.headers.getSetCookie()).toEqual(['next-auth.csrf-token=abc; Path=/; HttpOnly; SameSite=Lax']);
    expect(out.headers.get('content-type')).toBe('application/json');

    const clearing = new Headers();
    clearing.append('set-cookie', 'next-auth.session-token=; Path=/; Max-Age=0; HttpOnly; SameSite=Lax');
    expect(withoutReissuedSessionCookie(new Response('{}', { headers: clearing })).headers.getSetCookie()).toHaveLength(1);
  });
});
