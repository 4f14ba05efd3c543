import { sql } from 'kysely';
import type { DB } from '@/db/index';

// Five failures inside fifteen minutes lock the e-mail for fifteen minutes (common practice, no published source).
export const THROTTLE = { maxFailures: 5, windowMs: 15 * 60_000, lockMs: 15 * 60_000 };

/** Milliseconds the e-mail stays locked, or 0 when a sign-in may be tried. */
export async function lockRemainingMs(db: DB, email: string, now = new Date()): Promise<number> {
  const row = await db.selectFrom('sign_in_throttle').select('locked_until').where('email', '=', email).executeTakeFirst();
  if (!row?.locked_until) return 0;
  return Math.max(0, new Date(row.locked_until).getTime() - now.getTime());
}

export async function recordFailedSignIn(db: DB, email: string, now = new Date()): Promise<void> {
  const windowStart = new Date(now.getTime() - THROTTLE.windowMs);
  const lockUntil = new Date(now.getTime() + THROTTLE.lockMs);
  // One statement, so concurrent failures all count.
  await sql`
    INSERT INTO sign_in_throttle (email, failures, window_started_at, locked_until)
    VALUES (${email}, 1, ${now}, NULL)
    ON CONFLICT (email) DO UPDATE SET
      failures = CASE WHEN sign_in_throttle.window_started_at < ${windowStart} THEN 1 ELSE sign_in_throttle.failures + 1 END,
      window_started_at = CASE WHEN sign_in_throttle.window_started_at < ${windowStart} THEN ${now} ELSE sign_in_throttle.window_started_at END,
      locked_until = CASE
        WHEN sign_in_throttle.window_started_at >= ${windowStart} AND sign_in_throttle.failures + 1 >= ${THROTTLE.maxFailures}
        THEN ${lockUntil}::timestamptz ELSE sign_in_throttle.locked_until END
  `.execute(db);
}

export async function clearFailedSignIns(db: DB, email: string): Promise<void> {
  await db.deleteFrom('sign_in_throttle').where('email', '=', email).execute();
}
