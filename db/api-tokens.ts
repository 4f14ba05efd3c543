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
};

export async function createApiToken(db: DB, userId: string, name: string, tokenHash: string, prefix: string): Promise<ApiTokenSummary> {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .insertInto('api_tokens')
      .values({ user_id: userId, name, token_hash: tokenHash, token_prefix: prefix })
      .returningAll()
      .executeTakeFirstOrThrow();
    await writeAudit(trx, { actorUserId: userId, action: 'api-token.create', entityType: 'api_token', entityId: row.id, details: { name } });
    return { id: row.id, name: row.name, prefix: row.token_prefix, createdAt: row.created_at, lastUsedAt: null, revokedAt: null };
  });
}

export async function listApiTokens(db: DB, userId: string): Promise<ApiTokenSummary[]> {
  const rows = await db.selectFrom('api_tokens').selectAll().where('user_id', '=', userId).orderBy('created_at', 'desc').execute();
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    prefix: r.token_prefix,
    createdAt: r.created_at,
    lastUsedAt: r.last_used_at,
    revokedAt: r.revoked_at,
  }));
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

export async function countRecentTokens(db: DB, userId: string, sinceMs: number): Promise<number> {
  const row = await db
    .selectFrom('api_tokens')
    .select(db.fn.countAll<number>().as('n'))
    .where('user_id', '=', userId)
    .where('created_at', '>', new Date(Date.now() - sinceMs))
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

// Last-used times are kept to the minute: one write per token per minute, not one per request.
const TOUCH_EVERY_MS = 60_000;

/** The live (not revoked) token's user; refreshes its last-used time when that is over a minute old. */
export async function userForTokenHash(db: DB, tokenHash: string): Promise<AppUser | null> {
  const row = await db
    .selectFrom('api_tokens')
    .innerJoin('users', 'users.id', 'api_tokens.user_id')
    .select([
      'api_tokens.id as token_id', 'api_tokens.last_used_at',
      'users.id', 'users.email', 'users.name', 'users.role', 'users.organization_id', 'users.jurisdiction_id', 'users.is_demo',
    ])
    .where('api_tokens.token_hash', '=', tokenHash)
    .where('api_tokens.revoked_at', 'is', null)
    .executeTakeFirst();
  if (!row) return null;
  if (!row.last_used_at || Date.now() - new Date(row.last_used_at).getTime() > TOUCH_EVERY_MS) {
    await db.updateTable('api_tokens').set({ last_used_at: new Date() }).where('id', '=', row.token_id).execute();
  }
  return toAppUser(row);
}
