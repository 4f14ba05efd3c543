import 'server-only';
import { normalizeEmail } from '@/db/users';
import { sharedLimiter, type LimitPolicy } from '@/lib/platform/rate-limit';

/*
 * Requests that send e-mail to an address someone typed (sign-up, password reset, resending the
 * confirmation) are counted per e-mail and per client address, so nobody can fill a stranger's inbox or
 * sweep many addresses from one place. A person needs one or two of each in an hour; an office behind one
 * address still fits in ten. The numbers are common practice, no published source.
 */
function perEmail(name: string, points: number, what: string): LimitPolicy {
  return { name: `${name}:email`, points, durationSeconds: 3600, message: `Too many ${what} for this e-mail address in the last hour; try again later.` };
}
function perAddress(name: string, points: number, what: string): LimitPolicy {
  return { name: `${name}:address`, points, durationSeconds: 3600, message: `Too many ${what} from your network in the last hour; try again later.` };
}

export const accountLimits = {
  signUpEmail: perEmail('sign-up', 3, 'sign-ups'),
  signUpAddress: perAddress('sign-up', 10, 'sign-ups'),
  resetEmail: perEmail('password-reset', 3, 'password reset requests'),
  resetAddress: perAddress('password-reset', 10, 'password reset requests'),
  confirmationEmail: perEmail('email-confirmation', 3, 'confirmation e-mails'),
  confirmationAddress: perAddress('email-confirmation', 10, 'confirmation e-mails'),
} satisfies Record<string, LimitPolicy>;

type Pair = { email: LimitPolicy; address: LimitPolicy };

/** Counts one request; throws TooManyRequestsError (429 with Retry-After) when either count is over. */
async function count(pair: Pair, email: string, address: string): Promise<void> {
  const limiter = sharedLimiter();
  await limiter.consume(pair.address, address);
  await limiter.consume(pair.email, normalizeEmail(email));
}

export const countSignUp = (email: string, address: string) => count({ email: accountLimits.signUpEmail, address: accountLimits.signUpAddress }, email, address);
export const countPasswordResetRequest = (email: string, address: string) => count({ email: accountLimits.resetEmail, address: accountLimits.resetAddress }, email, address);
export const countConfirmationRequest = (email: string, address: string) => count({ email: accountLimits.confirmationEmail, address: accountLimits.confirmationAddress }, email, address);
