import 'server-only';
import type { LimitPolicy } from '@/lib/platform/rate-limit';
import { sharedLimiter } from '@/lib/platform/rate-limit';

/*
 * Limits on the routes that cost the most (an evaluation, a PDF render, a stored photo), counted in PostgreSQL
 * so they hold across app servers. Set so honest use never meets them: an integration evaluating a few plans a
 * second uses a fraction of its token's minute, and an installer issues and uploads by hand. Figures are
 * judgement, not a published source (common practice, no published source); the README states them.
 */

/**
 * A per-minute figure an operator may raise for a deployment (a load test, a large integrator) through the
 * environment; anything but a positive whole number there is refused at start rather than read as "no limit".
 */
function perMinute(envName: string, fallback: number): number {
  const raw = process.env[envName];
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1) throw new Error(`${envName} must be a positive whole number of requests a minute; it is "${raw}".`);
  return n;
}

/**
 * Evaluations come many a second from one integration: an app server counts them in the shared store in blocks
 * of up to 1 % of the limit (at most 50), so most requests skip the round trip to PostgreSQL. Never more than the
 * limit is answered; a server's unused block is dropped when the minute ends.
 */
function countAhead(points: number): number {
  return Math.max(1, Math.min(50, Math.floor(points / 100)));
}

const perToken = perMinute('NOOKPASS_EVALUATIONS_PER_TOKEN_PER_MINUTE', 1200);
const perUser = perMinute('NOOKPASS_EVALUATIONS_PER_USER_PER_MINUTE', 2400);

/** Per API token: 1,200 evaluations a minute (20 a second, sustained) unless the deployment says otherwise. */
export const EVALUATIONS_PER_TOKEN: LimitPolicy = {
  name: 'evaluations-token',
  points: perToken,
  durationSeconds: 60,
  countAhead: countAhead(perToken),
  message: `This API token has asked for ${perToken.toLocaleString('en-US')} evaluations in the last minute, the most NookPass answers for one token; wait a moment.`,
};

/** Per person, whatever token or browser they use: 2,400 evaluations a minute unless the deployment says otherwise. */
export const EVALUATIONS_PER_USER: LimitPolicy = {
  name: 'evaluations-user',
  points: perUser,
  durationSeconds: 60,
  countAhead: countAhead(perUser),
  message: `Your account has asked for ${perUser.toLocaleString('en-US')} evaluations in the last minute across all its tokens; wait a moment.`,
};

/** Per person: 120 reports issued an hour (each renders a PDF). */
export const REPORT_ISSUES_PER_USER: LimitPolicy = {
  name: 'report-issue',
  points: 120,
  durationSeconds: 3600,
  message: 'You have issued 120 reports in the last hour, the most NookPass renders for one person; try again later.',
};

/** Per person: 300 uploads an hour. */
export const UPLOADS_PER_USER: LimitPolicy = {
  name: 'upload',
  points: 300,
  durationSeconds: 3600,
  message: 'You have uploaded 300 files in the last hour, the most NookPass stores for one person; try again later.',
};

type Caller = { user: { id: string }; tokenId?: string };

/** Counts one evaluation against the token (when one is used) and the person; over either, 429 with Retry-After. */
export async function countEvaluation(caller: Caller): Promise<void> {
  const limiter = sharedLimiter();
  if (caller.tokenId) await limiter.consume(EVALUATIONS_PER_TOKEN, caller.tokenId);
  await limiter.consume(EVALUATIONS_PER_USER, caller.user.id);
}

export async function countReportIssue(userId: string): Promise<void> {
  await sharedLimiter().consume(REPORT_ISSUES_PER_USER, userId);
}

export async function countUpload(userId: string): Promise<void> {
  await sharedLimiter().consume(UPLOADS_PER_USER, userId);
}
