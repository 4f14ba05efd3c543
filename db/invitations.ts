import { sql } from 'kysely';
import type { DB } from '@/db/index';
import type { InvitedRole } from '@/db/types';

export type Invitation = {
  id: string;
  email: string;
  role: InvitedRole;
  organizationId: string | null;
  organizationName: string | null;
  jurisdictionId: string | null;
  jurisdictionName: string | null;
  invitedByEmail: string | null;
  createdAt: Date;
  expiresAt: Date;
  acceptedAt: Date | null;
  revokedAt: Date | null;
};

function baseQuery(db: DB) {
  return db
    .selectFrom('invitations as i')
    .leftJoin('organizations as o', 'o.id', 'i.organization_id')
    .leftJoin('jurisdictions as j', 'j.id', 'i.jurisdiction_id')
    .leftJoin('users as u', 'u.id', 'i.invited_by')
    .select([
      'i.id', 'i.email', 'i.role', 'i.organization_id', 'i.jurisdiction_id', 'i.created_at', 'i.expires_at', 'i.accepted_at', 'i.revoked_at',
      'o.name as organization_name', 'j.name as jurisdiction_name', 'u.email as invited_by_email',
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof baseQuery>['executeTakeFirstOrThrow']>>;

function toInvitation(r: Row): Invitation {
  return {
    id: r.id,
    email: r.email,
    role: r.role,
    organizationId: r.organization_id,
    organizationName: r.organization_name,
    jurisdictionId: r.jurisdiction_id,
    jurisdictionName: r.jurisdiction_name,
    invitedByEmail: r.invited_by_email,
    createdAt: r.created_at,
    expiresAt: r.expires_at,
    acceptedAt: r.accepted_at,
    revokedAt: r.revoked_at,
  };
}

export type NewInvitation = {
  email: string;
  role: InvitedRole;
  organizationId: string | null;
  jurisdictionId: string | null;
  invitedBy: string;
  tokenHash: string;
  lifetimeDays: number;
};

/** Stores an invitation (only the token's hash) with an expiry by the database's clock. */
export async function insertInvitation(db: DB, input: NewInvitation): Promise<{ id: string; expiresAt: Date }> {
  const row = await db
    .insertInto('invitations')
    .values({
      email: input.email,
      role: input.role,
      organization_id: input.organizationId,
      jurisdiction_id: input.jurisdictionId,
      invited_by: input.invitedBy,
      token_hash: input.tokenHash,
      expires_at: sql<Date>`now() + ${`${input.lifetimeDays} days`}::interval`,
    })
    .returning(['id', 'expires_at'])
    .executeTakeFirstOrThrow();
  return { id: row.id, expiresAt: row.expires_at };
}

/**
 * Withdraws the pending invitations to `email` sent from the same place (one company, or the admins when
 * `organizationId` is null), so only the newest link works; returns their ids.
 */
export async function revokePendingInvitationsTo(db: DB, email: string, organizationId: string | null): Promise<string[]> {
  const rows = await db
    .updateTable('invitations')
    .set({ revoked_at: new Date() })
    .where('email', '=', email)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .where((eb) => (organizationId ? eb('organization_id', '=', organizationId) : eb('organization_id', 'is', null)))
    .returning('id')
    .execute();
  return rows.map((r) => r.id);
}

export async function findInvitationById(db: DB, id: string): Promise<Invitation | null> {
  const row = await baseQuery(db).where('i.id', '=', id).executeTakeFirst();
  return row ? toInvitation(row) : null;
}

export async function findInvitationByTokenHash(db: DB, tokenHash: string): Promise<Invitation | null> {
  const row = await baseQuery(db).where('i.token_hash', '=', tokenHash).executeTakeFirst();
  return row ? toInvitation(row) : null;
}

/**
 * The invitation the token names, its row locked for the transaction so two acceptances of one link run
 * one after the other; `isExpired` is judged by the database's clock.
 */
export async function lockInvitationByTokenHash(db: DB, tokenHash: string): Promise<(Invitation & { isExpired: boolean }) | null> {
  const row = await db
    .selectFrom('invitations')
    .select(['id', sql<boolean>`expires_at <= now()`.as('is_expired')])
    .where('token_hash', '=', tokenHash)
    .forUpdate()
    .executeTakeFirst();
  if (!row) return null;
  const full = await findInvitationById(db, row.id);
  return full ? { ...full, isExpired: row.is_expired } : null;
}

export async function markInvitationAccepted(db: DB, id: string, userId: string): Promise<void> {
  await db
    .updateTable('invitations')
    .set({ accepted_at: new Date(), accepted_user_id: userId })
    .where('id', '=', id)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .executeTakeFirstOrThrow();
}

/** Revokes a pending invitation; false when it was already used or revoked. */
export async function markInvitationRevoked(db: DB, id: string): Promise<boolean> {
  const res = await db
    .updateTable('invitations')
    .set({ revoked_at: new Date() })
    .where('id', '=', id)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .executeTakeFirst();
  return Number(res.numUpdatedRows) > 0;
}

/**
 * Invitations not yet used or revoked (expired ones too, so the sender sees they lapsed), newest first:
 * a company's, or with `organizationId` null the admins' (inspectors and admins).
 */
export async function listOpenInvitations(db: DB, scope: { organizationId: string } | { admins: true }, limit = 200): Promise<Invitation[]> {
  let q = baseQuery(db).where('i.accepted_at', 'is', null).where('i.revoked_at', 'is', null);
  q = 'organizationId' in scope ? q.where('i.organization_id', '=', scope.organizationId) : q.where('i.organization_id', 'is', null);
  const rows = await q.orderBy('i.created_at', 'desc').limit(limit).execute();
  return rows.map(toInvitation);
}
