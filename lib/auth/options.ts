import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { getDb } from '@/db';
import { clearFailedSignIns, lockRemainingMs, recordFailedSignIn } from '@/db/sign-in-throttle';
import { findUserForSignIn, normalizeEmail } from '@/db/users';
import { safeCallbackPath } from './callback-url';
import { DUMMY_HASH, verifyPassword } from './password';

export const THROTTLED_ERROR = 'throttled';
const SESSION_HOURS = 12;

export const authOptions: NextAuthOptions = {
  secret: process.env.NEXTAUTH_SECRET,
  session: { strategy: 'jwt', maxAge: SESSION_HOURS * 3600 },
  pages: { signIn: '/sign-in', signOut: '/sign-out', error: '/sign-in' },
  providers: [
    CredentialsProvider({
      name: 'E-mail and password',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      async authorize(credentials) {
        const email = normalizeEmail(String(credentials?.email ?? ''));
        const password = String(credentials?.password ?? '');
        if (!email || !password || email.length > 320 || password.length > 1024) return null;
        const db = getDb();
        if ((await lockRemainingMs(db, email)) > 0) throw new Error(THROTTLED_ERROR);
        const found = await findUserForSignIn(db, email);
        // Unknown e-mail and wrong password take the same path and time, and get the same answer.
        const ok = await verifyPassword(password, found?.passwordHash ?? DUMMY_HASH);
        if (!found || !ok) {
          await recordFailedSignIn(db, email);
          return null;
        }
        await clearFailedSignIns(db, email);
        const u = found.user;
        return { id: u.id, email: u.email, name: u.name, role: u.role, organizationId: u.organizationId, jurisdictionId: u.jurisdictionId };
      },
    }),
  ],
  callbacks: {
    // next-auth's default passes any string that starts with a slash, backslash tricks included.
    redirect({ url, baseUrl }) {
      const origin = new URL(baseUrl).origin;
      return origin + safeCallbackPath(url, { origin });
    },
    async jwt({ token, user }) {
      if (user) {
        token.uid = user.id;
        token.role = user.role;
        token.organizationId = user.organizationId;
        token.jurisdictionId = user.jurisdictionId;
      }
      return token;
    },
    async session({ session, token }) {
      session.user = {
        ...session.user,
        id: token.uid,
        role: token.role,
        organizationId: token.organizationId,
        jurisdictionId: token.jurisdictionId,
      };
      return session;
    },
  },
};
