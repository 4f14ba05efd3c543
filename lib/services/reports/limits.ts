import 'server-only';
import { sharedLimiter, type LimitPolicy } from '@/lib/platform/rate-limit';

/**
 * Public report lookups (the facts API, the verification POST and the /verify page) per client address:
 * 60 a minute. An inspector checking a stack of papers by hand opens one every few seconds, and an office
 * of several behind one address still fits; guessing codes gets one try a second instead of hundreds
 * (common practice, no published source).
 */
export const REPORT_LOOKUP_LIMIT: LimitPolicy = {
  name: 'report-lookup',
  points: 60,
  durationSeconds: 60,
  message: 'Too many report lookups from your address in the last minute; wait a moment and try again.',
};

/** Counts one lookup; over the limit it throws TooManyRequestsError (429 with Retry-After). */
export async function countReportLookup(address: string): Promise<void> {
  await sharedLimiter().consume(REPORT_LOOKUP_LIMIT, address);
}

/**
 * Report e-mails per company: 30 an hour. A busy company sends a handful of reports a day; the limit keeps
 * one account from turning NookPass into a mail cannon, and counts across app servers like the rest
 * (common practice, no published source).
 */
export const REPORT_SEND_LIMIT: LimitPolicy = {
  name: 'report-send',
  points: 30,
  durationSeconds: 3600,
  message: 'Your company has e-mailed 30 reports in the last hour, the most NookPass sends for one company; try again later.',
};

/** Counts one report e-mail for the company; over the limit it throws TooManyRequestsError (429 with Retry-After). */
export async function countReportSend(organizationId: string): Promise<void> {
  await sharedLimiter().consume(REPORT_SEND_LIMIT, organizationId);
}
