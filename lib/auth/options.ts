import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { getDb } from '@/db';
import { normalizeEmail } from '@/db/users';
import { clientAddress } from '@/lib/platform/rate-limit';
import { safeCallbackPath } from './callback-url';
import { PasswordCheckBusyError } from './password';
import { checkCredentials, MAX_EMAIL_LENGTH, MAX_PASSWORD_LENGTH, signInSucceeded } from './sign-in';
import { SIGN_IN_BUSY } from './sign-in-messages';

const SESSION_HOURS = 12;

export const authOptions: NextAuthOptions = {
  secret: process.env.NEXTAUTH_SECRET,
  session: { strategy: 'jwt', maxAge: SESSION_HOURS * 3600 },
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
          throw err;
        }
        if (!user) return null;
        await signInSucceeded(email, clientAddress({ headers: new Headers(req.headers as Record<string, string>) }));
        return { id: user.id, email: user.email, name: user.name, role: user.role, organizationId: user.organizationId, jurisdictionId: user.jurisdictionId };
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
