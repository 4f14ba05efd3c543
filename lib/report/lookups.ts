import 'server-only';
import { sharedLimiter, type LimitPolicy } from '@/lib/platform/rate-limit';

/**
 * Public report lookups (the facts API, the verification POST and the /verify page) per client address:
 * 60 a minute. An inspector checking a stack of papers by hand opens one every few seconds, and an office
 * of several behind one address still fits; guessing codes gets one try a second instead of hundreds.
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
