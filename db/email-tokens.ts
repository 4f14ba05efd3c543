import { sql } from 'kysely';
import type { DB } from '@/db/index';

/** The tables holding single-use tokens sent by e-mail; each row keeps only the token's SHA-256. */
export type EmailTokenKind = 'password_resets' | 'email_confirmations';

/** What a token turned out to be: usable (for its user), or why not. */
export type EmailTokenState =
  | { status: 'valid'; id: string; userId: string; expiresAt: Date }
  | { status: 'expired'; expiresAt: Date }
  | { status: 'used'; usedAt: Date }
  | { status: 'unknown' };

export async function insertEmailToken(
  db: DB,
  kind: EmailTokenKind,
  input: { userId: string; tokenHash: string; lifetimeSeconds: number },
): Promise<{ id: string; expiresAt: Date }> {
  const row = await db
    .insertInto(kind)
    .values({
      user_id: input.userId,
      token_hash: input.tokenHash,
      expires_at: sql<Date>`now() + ${`${Math.floor(input.lifetimeSeconds)} seconds`}::interval`,
    })
    .returning(['id', 'expires_at'])
    .executeTakeFirstOrThrow();
  return { id: row.id, expiresAt: row.expires_at };
}

/** What the token is now (by the database's clock), without using it: for the page a link opens. */
export async function findEmailToken(db: DB, kind: EmailTokenKind, tokenHash: string): Promise<EmailTokenState> {
  const row = await db
    .selectFrom(kind)
    .select(['id', 'user_id', 'expires_at', 'used_at', sql<boolean>`expires_at <= now()`.as('is_expired')])
    .where('token_hash', '=', tokenHash)
    .executeTakeFirst();
  if (!row) return { status: 'unknown' };
  if (row.used_at) return { status: 'used', usedAt: row.used_at };
  if (row.is_expired) return { status: 'expired', expiresAt: row.expires_at };
  return { status: 'valid', id: row.id, userId: row.user_id, expiresAt: row.expires_at };
}

/**
 * Uses the token: marks it used when it is neither used nor expired, and says why not otherwise. Call it
 * inside the transaction that does what the token allows, so the token is spent exactly when that happens;
 * the conditional UPDATE takes the row's lock, so two requests racing with one token cannot both win.
 */
export async function consumeEmailToken(trx: DB, kind: EmailTokenKind, tokenHash: string): Promise<EmailTokenState> {
  const spent = await trx
    .updateTable(kind)
    .set({ used_at: sql<Date>`now()` })
    .where('token_hash', '=', tokenHash)
    .where('used_at', 'is', null)
    .where('expires_at', '>', sql<Date>`now()`)
    .returning(['id', 'user_id', 'expires_at'])
    .executeTakeFirst();
  if (spent) return { status: 'valid', id: spent.id, userId: spent.user_id, expiresAt: spent.expires_at };
  return findEmailToken(trx, kind, tokenHash);
}

/** Ends the user's other unused tokens of this kind (a newer link, or the thing they were for is done). */
export async function expireOtherEmailTokens(db: DB, kind: EmailTokenKind, userId: string, exceptId?: string): Promise<void> {
  let q = db.updateTable(kind).set({ used_at: sql<Date>`now()` }).where('user_id', '=', userId).where('used_at', 'is', null);
  if (exceptId) q = q.where('id', '<>', exceptId);
  await q.execute();
}
