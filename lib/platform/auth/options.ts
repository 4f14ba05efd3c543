import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import { encode as encodeJwt } from 'next-auth/jwt';
import CredentialsProvider from 'next-auth/providers/credentials';
import { getDb } from '@/db';
import { normalizeEmail } from '@/db/users';
import { clientAddress } from '@/lib/platform/rate-limit';
import { safeCallbackPath } from '@/lib/platform/auth/callback-url';
import { PasswordCheckBusyError } from '@/lib/platform/auth/password';
import { auditSignIn, checkCredentials, DeactivatedAccountError, MAX_EMAIL_LENGTH, MAX_PASSWORD_LENGTH, signInSucceeded } from '@/lib/platform/auth/sign-in';
import { SIGN_IN_BUSY, SIGN_IN_DEACTIVATED } from '@/lib/platform/auth/sign-in-messages';
import { SESSION_LIFETIME_SECONDS, SessionEndedError, endSession, remainingSeconds, requireLiveSession, startSession } from '@/lib/platform/auth/sessions';
import { log } from '@/lib/platform/log';

/** Expected ends of a session are not errors worth a log line: a signed-out or expired cookie came back. */
function isEndedSession(metadata: unknown): boolean {
  const err = metadata as { name?: string; code?: string } | undefined;
  return metadata instanceof SessionEndedError || err?.name === 'SessionEndedError' || err?.code === 'ERR_JWT_EXPIRED';
}

export const authOptions: NextAuthOptions = {
  secret: process.env.NEXTAUTH_SECRET,
  // The cookie's maxAge equals the session row's lifetime; next-auth v4 ignores updateAge for JWT sessions.
  session: { strategy: 'jwt', maxAge: SESSION_LIFETIME_SECONDS },
  jwt: {
    // The JWT's own exp never passes the session's absolute expiry, whenever next-auth re-encodes it.
    encode: (params) => encodeJwt({ ...params, maxAge: remainingSeconds(params.token?.sessionExpiresAt, params.maxAge ?? SESSION_LIFETIME_SECONDS) }),
  },
  logger: {
    error(code, metadata) {
      if (isEndedSession(metadata)) return;
      log.error({ code, metadata }, 'sign-in library error');
    },
    warn(code) {
      log.warn({ code }, 'sign-in library warning');
    },
    debug() {},
  },
  pages: { signIn: '/sign-in', signOut: '/sign-out', error: '/sign-in' },
  providers: [
    CredentialsProvider({
      name: 'E-mail and password',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      // The route in front of next-auth has already counted this attempt (refuseThrottledSignIn).
      async authorize(credentials, req) {
        const email = normalizeEmail(String(credentials?.email ?? ''));
        const password = String(credentials?.password ?? '');
        if (!email || !password || email.length > MAX_EMAIL_LENGTH || password.length > MAX_PASSWORD_LENGTH) return null;
        let user;
        try {
          user = await checkCredentials(getDb(), email, password);
        } catch (err) {
          if (err instanceof PasswordCheckBusyError) throw new Error(SIGN_IN_BUSY);
          if (err instanceof DeactivatedAccountError) throw new Error(SIGN_IN_DEACTIVATED);
          throw err;
        }
        const headers = new Headers(req.headers as Record<string, string>);
        await auditSignIn(getDb(), email, user, clientAddress({ headers }));
        if (!user) return null;
        await signInSucceeded(email, clientAddress({ headers }));
        const session = await startSession(user.id, headers);
        return { ...user, sessionId: session.id, sessionExpiresAt: session.expiresAtSeconds };
      },
    }),
  ],
  callbacks: {
    // next-auth's default passes any string that starts with a slash, backslash tricks included.
    redirect({ url, baseUrl }) {
      const origin = new URL(baseUrl).origin;
      return origin + safeCallbackPath(url, { origin });
    },
    // Runs on every session read (getServerSession, /api/auth/session): the session row must still be live.
    async jwt({ token, user }) {
      if (user) {
        token.uid = user.id;
        token.sid = user.sessionId;
        token.sessionExpiresAt = user.sessionExpiresAt;
        return token;
      }
      try {
        const live = await requireLiveSession(token.sid, token.uid);
        // The user as stored now, so a changed role or name takes effect at once.
        return { ...token, user: live.user, unavailable: undefined };
      } catch (err) {
        if (err instanceof SessionEndedError) throw err;
        // The database could not say: that is an outage (503), not a reason to sign anyone out.
        log.error({ err }, 'session lookup failed');
        return { ...token, user: undefined, unavailable: true };
      }
    },
    async session({ token }) {
      const expires = new Date(token.sessionExpiresAt * 1000).toISOString();
      if (token.unavailable || !token.user) return { unavailable: true, expires };
      return { user: { ...token.user, sessionId: token.sid }, expires };
    },
  },
  events: {
    async signOut({ token }) {
      await endSession(token?.sid);
    },
  },
};
