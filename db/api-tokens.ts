import { sql } from 'kysely';
import type { DB } from '@/db/index';
import { writeAudit } from '@/db/audit';
import { toAppUser } from '@/db/users';
import type { AppUser } from '@/lib/domain/roles';

export type ApiTokenSummary = {
  id: string;
  name: string;
  prefix: string;
  createdAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
  expiresAt: Date;
  /** Past its expiry by the database's clock. */
  isExpired: boolean;
};

export type NewApiToken = { name: string; tokenHash: string; prefix: string; expiresInDays: number };

export type CreateTokenResult =
  | { created: true; token: ApiTokenSummary }
  | { created: false; retryAfterSeconds: number };

/**
 * Creates a token unless the user made `perHour` in the last hour. The user's row is locked for the
 * transaction, so parallel requests count one after another and the limit holds exactly.
 */
export async function createApiTokenWithinLimit(db: DB, userId: string, input: NewApiToken, perHour: number): Promise<CreateTokenResult> {
  return db.transaction().execute(async (trx) => {
    // FOR NO KEY UPDATE: serializes token creation per user without blocking rows that merely reference the user.
    await trx.selectFrom('users').select('id').where('id', '=', userId).forNoKeyUpdate().executeTakeFirstOrThrow();
    const recent = await trx
      .selectFrom('api_tokens')
      .select(['created_at'])
      .where('user_id', '=', userId)
      .where('created_at', '>', sql<Date>`now() - interval '1 hour'`)
      .orderBy('created_at', 'desc')
      .limit(perHour)
      .execute();
    if (recent.length >= perHour) {
      // The next one may be made an hour after the oldest of the last `perHour`.
      const oldest = new Date(recent[recent.length - 1].created_at).getTime();
      return { created: false, retryAfterSeconds: Math.max(1, Math.ceil((oldest + 3600_000 - Date.now()) / 1000)) };
    }
    const row = await trx
      .insertInto('api_tokens')
      .values({
        user_id: userId,
        name: input.name,
        token_hash: input.tokenHash,
        token_prefix: input.prefix,
        expires_at: sql<Date>`now() + ${`${input.expiresInDays} days`}::interval`,
      })
      .returningAll()
      .executeTakeFirstOrThrow();
    await writeAudit(trx, { actorUserId: userId, action: 'api-token.create', entityType: 'api_token', entityId: row.id, details: { name: input.name, expiresInDays: input.expiresInDays } });
    return { created: true, token: toSummary({ ...row, is_expired: false }) };
  });
}

type TokenRow = { id: string; name: string; token_prefix: string; created_at: Date; last_used_at: Date | null; revoked_at: Date | null; expires_at: Date; is_expired: boolean };

function toSummary(r: TokenRow): ApiTokenSummary {
  return {
    id: r.id,
    name: r.name,
    prefix: r.token_prefix,
    createdAt: r.created_at,
    lastUsedAt: r.last_used_at,
    revokedAt: r.revoked_at,
    expiresAt: r.expires_at,
    isExpired: r.is_expired,
  };
}

export async function listApiTokens(db: DB, userId: string): Promise<ApiTokenSummary[]> {
  const rows = await db
    .selectFrom('api_tokens')
    .selectAll()
    .select(sql<boolean>`expires_at <= now()`.as('is_expired'))
    .where('user_id', '=', userId)
    .orderBy('created_at', 'desc')
    .limit(500)
    .execute();
  return rows.map(toSummary);
}

/** Revokes one of the user's own tokens; false when it is not theirs or does not exist. */
export async function revokeApiToken(db: DB, userId: string, tokenId: string): Promise<boolean> {
  return db.transaction().execute(async (trx) => {
    const res = await trx
      .updateTable('api_tokens')
      .set({ revoked_at: new Date() })
      .where('id', '=', tokenId)
      .where('user_id', '=', userId)
      .where('revoked_at', 'is', null)
      .executeTakeFirst();
    if (Number(res.numUpdatedRows) === 0) return false;
    await writeAudit(trx, { actorUserId: userId, action: 'api-token.revoke', entityType: 'api_token', entityId: tokenId });
    return true;
  });
}

export type TokenHolder = { user: AppUser; tokenId: string; expiresAt: Date; lastUsedAt: Date | null; isDeactivated: boolean };

/** The user of a token that is not revoked, with the token's expiry and last use; null for an unknown or revoked token. */
export async function findTokenHolder(db: DB, tokenHash: string): Promise<TokenHolder | null> {
  const row = await db
    .selectFrom('api_tokens')
    .innerJoin('users', 'users.id', 'api_tokens.user_id')
    .select([
      'api_tokens.id as token_id', 'api_tokens.last_used_at', 'api_tokens.expires_at',
      'users.id', 'users.email', 'users.name', 'users.role', 'users.organization_id', 'users.jurisdiction_id', 'users.is_owner', 'users.is_demo', 'users.deactivated_at',
    ])
    .where('api_tokens.token_hash', '=', tokenHash)
    .where('api_tokens.revoked_at', 'is', null)
    .executeTakeFirst();
  if (!row) return null;
  return { user: toAppUser(row), tokenId: row.token_id, expiresAt: row.expires_at, lastUsedAt: row.last_used_at, isDeactivated: row.deactivated_at !== null };
}

export async function touchApiToken(db: DB, tokenId: string, at: Date): Promise<void> {
  await db.updateTable('api_tokens').set({ last_used_at: at }).where('id', '=', tokenId).execute();
}
