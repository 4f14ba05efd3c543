import type { AppUser } from '@/lib/domain/roles';

declare module 'next-auth' {
  interface User extends AppUser {
    /** The session row this sign-in started (db/sessions.ts). */
    sessionId: string;
    /** Its absolute expiry, epoch seconds. */
    sessionExpiresAt: number;
  }
  interface Session {
    /** Absent when the session could not be checked (`unavailable`). */
    user?: AppUser & { sessionId: string };
    expires: string;
    /** The database did not answer: the caller gets a 503, and stays signed in. */
    unavailable?: true;
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    uid: string;
    sid: string;
    sessionExpiresAt: number;
    /** Loaded from the database on each read, never trusted from an older cookie. */
    user?: AppUser;
    unavailable?: true;
  }
}
