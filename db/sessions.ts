import { sql } from 'kysely';
import type { DB } from '@/db/index';
import { writeAudit } from '@/db/audit';
import { toAppUser } from '@/db/users';
import type { AppUser } from '@/lib/domain/roles';

export type SessionSummary = {
  id: string;
  createdAt: Date;
  lastSeenAt: Date;
  expiresAt: Date;
  userAgent: string | null;
  clientAddress: string | null;
};

export type LiveSession = { id: string; expiresAt: Date; user: AppUser };

// Ended sessions stay listed for a month (who signed in from where), then go.
const KEEP_ENDED_MS = 30 * 24 * 3600_000;
// Last-seen times are kept to the minute: one write per session per minute, not one per request.
const TOUCH_EVERY_MS = 60_000;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export async function createSession(
  db: DB,
  input: { userId: string; lifetimeMs: number; userAgent?: string | null; clientAddress?: string | null },
): Promise<{ id: string; expiresAt: Date }> {
  return db.transaction().execute(async (trx) => {
    await trx
      .deleteFrom('sessions')
      .where('user_id', '=', input.userId)
      .where((eb) => eb.or([eb('expires_at', '<', new Date(Date.now() - KEEP_ENDED_MS)), eb('revoked_at', '<', new Date(Date.now() - KEEP_ENDED_MS))]))
      .execute();
    const row = await trx
      .insertInto('sessions')
      .values({
        user_id: input.userId,
        expires_at: sql<Date>`now() + ${`${Math.floor(input.lifetimeMs / 1000)} seconds`}::interval`,
        user_agent: input.userAgent?.slice(0, 512) || null,
        client_address: input.clientAddress?.slice(0, 255) || null,
      })
      .returning(['id', 'expires_at'])
      .executeTakeFirstOrThrow();
    return { id: row.id, expiresAt: row.expires_at };
  });
}

/**
 * The session with its user, when it is neither revoked nor past its expiry (by the database's clock), or
 * null. Refreshes its last-seen time when that is over a minute old.
 */
export async function findLiveSession(db: DB, sessionId: string): Promise<LiveSession | null> {
  if (!UUID.test(sessionId)) return null;
  const row = await db
    .selectFrom('sessions as s')
    .innerJoin('users', 'users.id', 's.user_id')
    .select([
      's.id as session_id', 's.expires_at', 's.last_seen_at',
      'users.id', 'users.email', 'users.name', 'users.role', 'users.organization_id', 'users.jurisdiction_id', 'users.is_owner', 'users.is_demo',
    ])
    .where('s.id', '=', sessionId)
    // A switched-off person's sessions end on their next request.
    .where('users.deactivated_at', 'is', null)
    .where('s.revoked_at', 'is', null)
    .where('s.expires_at', '>', sql<Date>`now()`)
    .executeTakeFirst();
  if (!row) return null;
  if (Date.now() - new Date(row.last_seen_at).getTime() > TOUCH_EVERY_MS) {
    await db.updateTable('sessions').set({ last_seen_at: new Date() }).where('id', '=', row.session_id).execute();
  }
  return { id: row.session_id, expiresAt: row.expires_at, user: toAppUser(row) };
}

/** Ends one session (sign-out); false when it was already ended or does not exist. */
export async function revokeSession(db: DB, sessionId: string): Promise<boolean> {
  if (!UUID.test(sessionId)) return false;
  const res = await db.updateTable('sessions').set({ revoked_at: new Date() }).where('id', '=', sessionId).where('revoked_at', 'is', null).executeTakeFirst();
  return Number(res.numUpdatedRows) > 0;
}

/** Ends every live session of the user except `keepId`; returns how many ended. */
export async function revokeOtherSessions(db: DB, userId: string, keepId: string): Promise<number> {
  return db.transaction().execute(async (trx) => {
    const res = await trx
      .updateTable('sessions')
      .set({ revoked_at: new Date() })
      .where('user_id', '=', userId)
      .where('id', '<>', keepId)
      .where('revoked_at', 'is', null)
      .where('expires_at', '>', sql<Date>`now()`)
      .executeTakeFirst();
    const ended = Number(res.numUpdatedRows);
    await writeAudit(trx, { actorUserId: userId, action: 'session.revoke-others', entityType: 'session', entityId: keepId, details: { ended } });
    return ended;
  });
}

/** The user's live sessions, most recently seen first. */
export async function listLiveSessions(db: DB, userId: string): Promise<SessionSummary[]> {
  const rows = await db
    .selectFrom('sessions')
    .select(['id', 'created_at', 'last_seen_at', 'expires_at', 'user_agent', 'client_address'])
    .where('user_id', '=', userId)
    .where('revoked_at', 'is', null)
    .where('expires_at', '>', sql<Date>`now()`)
    .orderBy('last_seen_at', 'desc')
    .limit(100)
    .execute();
  return rows.map((r) => ({
    id: r.id,
    createdAt: r.created_at,
    lastSeenAt: r.last_seen_at,
    expiresAt: r.expires_at,
    userAgent: r.user_agent,
    clientAddress: r.client_address,
  }));
}
