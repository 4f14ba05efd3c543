import 'server-only';
import { getServerSession } from 'next-auth';
import { redirect } from 'next/navigation';
import { getDb } from '@/db';
import { userForTokenHash } from '@/db/api-tokens';
import { findUserById } from '@/db/users';
import { ForbiddenError, UnauthorizedError } from '@/lib/errors';
import { bearerToken, hashApiToken, looksLikeApiToken } from './api-token';
import { safeCallbackPath } from './callback-url';
import { authOptions } from './options';
import { hasRole, type AppUser, type Role } from './roles';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

function expectedOrigin(request: Request): string | null {
  const configured = process.env.NEXTAUTH_URL;
  if (configured) return new URL(configured).origin;
  const host = request.headers.get('host');
  return host ? `http://${host}` : null;
}

/** A cookie-authenticated write must come from our own pages (cross-site request forgery guard). */
function assertSameOrigin(request: Request): void {
  if (SAFE_METHODS.has(request.method)) return;
  const origin = request.headers.get('origin');
  if (!origin) return; // non-browser clients send no Origin; browsers always do on cross-site writes
  const host = request.headers.get('host');
  const expected = expectedOrigin(request);
  if (origin !== expected && !(host && originHost(origin) === host)) {
    throw new ForbiddenError('This request came from another site and was refused.');
  }
}

/** The host of an Origin header, or null for an opaque origin: browsers send 'null' from sandboxed frames and some redirects (RFC 6454 section 7). */
function originHost(origin: string): string | null {
  try {
    return new URL(origin).host || null;
  } catch {
    return null;
  }
}

/** The signed-in user of an API request (session cookie or Bearer token), or null. */
export async function currentApiUser(request: Request): Promise<AppUser | null> {
  const token = bearerToken(request);
  if (token !== null) {
    if (!looksLikeApiToken(token)) throw new UnauthorizedError('The API token is malformed.');
    const user = await userForTokenHash(getDb(), hashApiToken(token));
    if (!user) throw new UnauthorizedError('The API token is unknown or revoked.');
    return user;
  }
  const session = await getServerSession(authOptions);
  if (!session?.user?.id) return null;
  assertSameOrigin(request);
  // Reload so a changed role or a deleted account takes effect at once, not when the session expires.
  return findUserById(getDb(), session.user.id);
}

/** The one role check every route handler goes through. */
export async function requireUser(request: Request, allowed?: readonly Role[]): Promise<AppUser> {
  const user = await currentApiUser(request);
  if (!user) throw new UnauthorizedError();
  if (allowed && !hasRole(user, allowed)) throw new ForbiddenError();
  return user;
}

/** For server-component pages: anonymous visitors go to sign-in, other roles get a 403 page. */
export async function requirePageUser(allowed: readonly Role[] | undefined, path: string): Promise<AppUser> {
  const session = await getServerSession(authOptions);
  const user = session?.user?.id ? await findUserById(getDb(), session.user.id) : null;
  const back = encodeURIComponent(safeCallbackPath(path));
  if (!user) redirect(`/sign-in?callbackUrl=${back}`);
  if (allowed && !hasRole(user, allowed)) redirect(`/forbidden?from=${back}`);
  return user;
}

export async function optionalPageUser(): Promise<AppUser | null> {
  const session = await getServerSession(authOptions);
  return session?.user?.id ? findUserById(getDb(), session.user.id) : null;
}
