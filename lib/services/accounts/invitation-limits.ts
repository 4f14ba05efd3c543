import 'server-only';
import { sharedLimiter, type LimitPolicy } from '@/lib/platform/rate-limit';

/**
 * Invitations to one e-mail address: 5 an hour, whoever sends them. Enough to fix a typo in a name or resend
 * a lost link, too few to flood somebody's mailbox (common practice, no published source).
 */
export const INVITATION_EMAIL_LIMIT: LimitPolicy = {
  name: 'invitation:email',
  points: 5,
  durationSeconds: 3600,
  message: 'This address has been sent 5 invitations in the last hour; wait before sending another.',
};

/**
 * Invitations from one client address: 30 an hour. An office bringing its whole crew in sends a dozen or
 * two; a script sending hundreds is stopped (common practice, no published source).
 */
export const INVITATION_ADDRESS_LIMIT: LimitPolicy = {
  name: 'invitation:address',
  points: 30,
  durationSeconds: 3600,
  message: 'Too many invitations from your address in the last hour; wait before sending more.',
};

/** Acceptances tried from one client address: 20 in 15 minutes, so invitation links cannot be guessed at speed (common practice, no published source). */
export const INVITATION_ACCEPT_LIMIT: LimitPolicy = {
  name: 'invitation:accept',
  points: 20,
  durationSeconds: 15 * 60,
  message: 'Too many invitation attempts from your address; wait 15 minutes and try again.',
};

/** Counts one invitation against both limits; over either it throws TooManyRequestsError (429 with Retry-After). */
export async function countInvitation(email: string, address: string): Promise<void> {
  const limiter = sharedLimiter();
  await limiter.consume(INVITATION_ADDRESS_LIMIT, address);
  await limiter.consume(INVITATION_EMAIL_LIMIT, email);
}

export async function countInvitationAcceptance(address: string): Promise<void> {
  await sharedLimiter().consume(INVITATION_ACCEPT_LIMIT, address);
}
