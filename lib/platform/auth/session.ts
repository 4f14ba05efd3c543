import 'server-only';
import { getServerSession } from 'next-auth';
import { redirect } from 'next/navigation';
import { cache } from 'react';
import { getDb } from '@/db';
import { ForbiddenError, ServiceUnavailableError, UnauthorizedError } from '@/lib/domain/errors';
import { bearerToken, hashApiToken, looksLikeApiToken } from '@/lib/platform/auth/api-token';
import { safeCallbackPath } from '@/lib/platform/auth/callback-url';
import { tokenHolder } from '@/lib/platform/auth/token-holders';
import { authOptions } from '@/lib/platform/auth/options';
import { hasRole, type AppUser, type Role } from '@/lib/domain/roles';

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

export type Caller =
  | { via: 'session'; user: AppUser; sessionId: string }
  | { via: 'api-token'; user: AppUser; tokenId: string };

const UNAVAILABLE = 'The database is not reachable right now; nothing was changed. Try again in a moment.';

/**
 * The session cookie's caller: next-auth decodes the cookie and our jwt callback checks the session row
 * (not revoked, not past its absolute expiry) and loads the user as stored now, all in this one call.
 */
async function sessionCaller(): Promise<{ user: AppUser; sessionId: string } | null> {
  const session = await getServerSession(authOptions);
  if (session?.unavailable) throw new ServiceUnavailableError(UNAVAILABLE);
  if (!session?.user?.id) return null;
  const { sessionId, ...user } = session.user;
  return { user, sessionId };
}

/** Who makes an API request (Bearer token or session cookie), or null when nobody is signed in. */
export async function currentCaller(request: Request): Promise<Caller | null> {
  const token = bearerToken(request);
  if (token !== null) {
    if (!looksLikeApiToken(token)) throw new UnauthorizedError('The API token is malformed.');
    const holder = await tokenHolder(getDb(), hashApiToken(token));
    if (!holder) throw new UnauthorizedError('The API token is unknown or revoked.');
    if (holder.isDeactivated) throw new UnauthorizedError('The account this API token belongs to has been deactivated.');
    if (holder.expiresAt.getTime() <= Date.now()) {
      throw new UnauthorizedError(`The API token expired on ${holder.expiresAt.toISOString().slice(0, 10)}. Create a new one on the Account page.`);
    }
    return { via: 'api-token', user: holder.user, tokenId: holder.tokenId };
  }
  const caller = await sessionCaller();
  if (!caller) return null;
  assertSameOrigin(request);
  return { via: 'session', ...caller };
}

/** The signed-in user of an API request (session cookie or Bearer token), or null. */
export async function currentApiUser(request: Request): Promise<AppUser | null> {
  return (await currentCaller(request))?.user ?? null;
}

/** The one role check every route handler goes through. */
export async function requireUser(request: Request, allowed?: readonly Role[]): Promise<AppUser> {
  return (await requireCaller(request, allowed)).user;
}

/** requireUser, also saying how the caller came (a token's limits count per token). */
export async function requireCaller(request: Request, allowed?: readonly Role[]): Promise<Caller> {
  const caller = await currentCaller(request);
  if (!caller) throw new UnauthorizedError();
  if (allowed && !hasRole(caller.user, allowed)) throw new ForbiddenError();
  return caller;
}

/**
 * For what only a person at a signed-in browser may do (create tokens, end other sessions): an API token is
 * refused with 403 and `why`, so a leaked token cannot mint more tokens or lock its owner out.
 */
export async function requireSessionUser(request: Request, why: string, allowed?: readonly Role[]): Promise<{ user: AppUser; sessionId: string }> {
  const caller = await currentCaller(request);
  if (!caller) throw new UnauthorizedError();
  if (caller.via !== 'session') throw new ForbiddenError(why);
  if (allowed && !hasRole(caller.user, allowed)) throw new ForbiddenError();
  return { user: caller.user, sessionId: caller.sessionId };
}

// One session check per page render, shared by the layout and the page.
const pageCaller = cache(sessionCaller);

/** For server-component pages: anonymous visitors go to sign-in, other roles get a 403 page. */
export async function requirePageUser(allowed: readonly Role[] | undefined, path: string): Promise<AppUser> {
  return (await requirePageSession(allowed, path)).user;
}

/** requirePageUser, with the id of the session the page is shown in. */
export async function requirePageSession(allowed: readonly Role[] | undefined, path: string): Promise<{ user: AppUser; sessionId: string }> {
  const caller = await pageCaller();
  const back = encodeURIComponent(safeCallbackPath(path));
  if (!caller) redirect(`/sign-in?callbackUrl=${back}`);
  if (allowed && !hasRole(caller.user, allowed)) redirect(`/forbidden?from=${back}`);
  return caller;
}

export async function optionalPageUser(): Promise<AppUser | null> {
  return (await pageCaller())?.user ?? null;
}
