import 'server-only';
import type { DB } from '@/db';
import { writeAudit } from '@/db/audit';
import { findUserForSignIn, normalizeEmail, replacePasswordHash } from '@/db/users';
import { PayloadTooLargeError, TooManyRequestsError } from '@/lib/domain/errors';
import { errorResponse, readTextUpTo } from '@/lib/platform/http';
import { clientAddress, sharedLimiter, type LimitPolicy } from '@/lib/platform/rate-limit';
import { dummyHash, needsRehash, hashAtCurrentCost, verifyPassword } from '@/lib/platform/auth/password';
import type { AppUser } from '@/lib/domain/roles';
import { SIGN_IN_THROTTLED, THROTTLED_MESSAGE } from '@/lib/platform/auth/sign-in-messages';

/** The password was right but the person has been deactivated: no session. */
export class DeactivatedAccountError extends Error {
  constructor() {
    super('The account has been deactivated.');
    this.name = 'DeactivatedAccountError';
  }
}

export const MAX_EMAIL_LENGTH = 320; // 64 + 1 + 255, the bound RFC 3696 section 3 first gave
export const MAX_PASSWORD_LENGTH = 1024;

/*
 * Attempts are counted before the password is checked and given back when it turns out right, so parallel
 * guesses cannot slip past the counters, while people who sign in successfully are never counted.
 * The e-mail is counted together with the client address: an attacker elsewhere cannot lock a person out,
 * only slow themselves. The address alone is counted too, in two steps (a short burst, then a longer
 * window), so guessing across many e-mails from one place backs off. The shape follows
 * rate-limiter-flexible's login-protection recipe (consecutive failures by user and IP, failures by IP);
 * the numbers are common practice, no published source.
 */
export const signInPolicies = {
  emailAndAddress: { name: 'sign-in:email+address', points: 5, durationSeconds: 15 * 60, blockSeconds: 15 * 60, message: THROTTLED_MESSAGE },
  addressBurst: { name: 'sign-in:address:burst', points: 10, durationSeconds: 60, blockSeconds: 60, message: THROTTLED_MESSAGE },
  addressSustained: { name: 'sign-in:address', points: 30, durationSeconds: 15 * 60, blockSeconds: 15 * 60, message: THROTTLED_MESSAGE },
} satisfies Record<string, LimitPolicy>;

const pairKey = (email: string, address: string) => `${normalizeEmail(email)}\n${address}`;

/**
 * Counts one sign-in attempt; throws TooManyRequestsError, carrying the wait, when the address, or this
 * e-mail from this address, has had too many failures.
 */
export async function admitSignInAttempt(email: string, address: string): Promise<void> {
  const limiter = sharedLimiter();
  await limiter.consume(signInPolicies.addressBurst, address);
  await limiter.consume(signInPolicies.addressSustained, address);
  await limiter.consume(signInPolicies.emailAndAddress, pairKey(email, address));
}

/** A successful sign-in gives its attempt back and clears the e-mail's failures from this address. */
export async function signInSucceeded(email: string, address: string): Promise<void> {
  const limiter = sharedLimiter();
  await Promise.all([
    limiter.reset(signInPolicies.emailAndAddress, pairKey(email, address)),
    limiter.reward(signInPolicies.addressBurst, address),
    limiter.reward(signInPolicies.addressSustained, address),
  ]);
}

/**
 * The user whose e-mail and password these are, or null. A known e-mail with a wrong password and an
 * unknown e-mail do the same work (one lookup, one bcrypt comparison at the same cost), so neither time
 * nor answer tells them apart. A hash made at a lower cost than today's is redone on success.
 */
export async function checkCredentials(db: DB, email: string, password: string): Promise<AppUser | null> {
  const [found, fallback] = await Promise.all([findUserForSignIn(db, email), dummyHash()]);
  const ok = await verifyPassword(password, found?.passwordHash ?? fallback);
  if (!found || !ok) return null;
  if (found.isDeactivated) throw new DeactivatedAccountError();
  if (needsRehash(found.passwordHash)) {
    await replacePasswordHash(db, found.user.id, found.passwordHash, await hashAtCurrentCost(password));
  }
  return found.user;
}

// A sign-in form is a few hundred bytes; anything near this is not one.
const MAX_SIGN_IN_BODY_BYTES = 16 * 1024;

/** What a credentials sign-in names, read from a copy of the body (next-auth reads the original). */
async function readSignInForm(request: Request): Promise<{ email: string; json: boolean }> {
  const text = await readTextUpTo(request.clone(), MAX_SIGN_IN_BODY_BYTES);
  let fields: Record<string, unknown> = {};
  if ((request.headers.get('content-type') ?? '').includes('application/json')) {
    try {
      fields = Object(JSON.parse(text)) as Record<string, unknown>;
    } catch {
      fields = {};
    }
  } else {
    fields = Object.fromEntries(new URLSearchParams(text));
  }
  return { email: normalizeEmail(String(fields.email ?? '')).slice(0, MAX_EMAIL_LENGTH), json: String(fields.json) === 'true' };
}

/**
 * Runs in front of next-auth's credentials callback: counts the attempt and, when the address or this
 * e-mail from this address is over its limit, answers 429 with Retry-After (RFC 6585 section 4) before any
 * password work, in the shape next-auth's client reads (`{ url }` carrying `?error=throttled`).
 * Null means "go on to next-auth".
 */
export async function refuseThrottledSignIn(request: Request, origin: string): Promise<Response | null> {
  let form: { email: string; json: boolean };
  try {
    form = await readSignInForm(request);
  } catch (err) {
    if (err instanceof PayloadTooLargeError) return errorResponse(err);
    throw err;
  }
  try {
    await admitSignInAttempt(form.email, clientAddress(request));
    return null;
  } catch (err) {
    if (!(err instanceof TooManyRequestsError)) return errorResponse(err);
    const url = `${origin}/sign-in?error=${SIGN_IN_THROTTLED}`;
    const headers = { 'retry-after': String(err.retryAfterSeconds), 'cache-control': 'no-store' };
    if (form.json) return Response.json({ url, error: err.message }, { status: 429, headers });
    return new Response(null, { status: 303, headers: { ...headers, location: url } });
  }
}

/**
 * Every sign-in, successful or not, goes on the audit trail (OWASP Logging Cheat Sheet: authentication
 * successes and failures). A failure for a known address names that person, so their company's owners see
 * it; a failure for an unknown address keeps only the address typed.
 */
export async function auditSignIn(db: DB, email: string, user: AppUser | null, address: string): Promise<void> {
  if (user) {
    await writeAudit(db, { actorUserId: user.id, action: 'auth.sign-in', entityType: 'user', entityId: user.id, organizationId: user.organizationId, details: { address } });
    return;
  }
  const known = await findUserForSignIn(db, email);
  await writeAudit(db, {
    actorUserId: null,
    action: 'auth.sign-in-failed',
    entityType: 'user',
    entityId: known?.user.id ?? null,
    organizationId: known?.user.organizationId ?? null,
    details: { email: normalizeEmail(email).slice(0, MAX_EMAIL_LENGTH), address },
  });
}
