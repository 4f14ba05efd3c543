import { sql } from 'kysely';
import type { DB } from '@/db/index';
import type { Role } from '@/db/types';

/** One person as the people pages show them. */
export type Person = {
  id: string;
  email: string;
  name: string;
  role: Role;
  isOwner: boolean;
  organizationId: string | null;
  organizationName: string | null;
  jurisdictionId: string | null;
  jurisdictionName: string | null;
  deactivatedAt: Date | null;
  createdAt: Date;
  isDemo: boolean;
};

export type PeopleFilter = {
  organizationId?: string;
  /** Part of the name, e-mail, company or jurisdiction. */
  search?: string;
  /** 'owner' means installers who own their company. */
  role?: Role | 'owner';
  status?: 'active' | 'deactivated';
};

function peopleQuery(db: DB) {
  return db
    .selectFrom('users as u')
    .leftJoin('organizations as o', 'o.id', 'u.organization_id')
    .leftJoin('jurisdictions as j', 'j.id', 'u.jurisdiction_id')
    .select([
      'u.id', 'u.email', 'u.name', 'u.role', 'u.is_owner', 'u.organization_id', 'u.jurisdiction_id', 'u.deactivated_at', 'u.created_at', 'u.is_demo',
      'o.name as organization_name', 'j.name as jurisdiction_name',
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof peopleQuery>['executeTakeFirstOrThrow']>>;

function toPerson(r: Row): Person {
  return {
    id: r.id,
    email: r.email,
    name: r.name,
    role: r.role,
    isOwner: r.is_owner,
    organizationId: r.organization_id,
    organizationName: r.organization_name,
    jurisdictionId: r.jurisdiction_id,
    jurisdictionName: r.jurisdiction_name,
    deactivatedAt: r.deactivated_at,
    createdAt: r.created_at,
    isDemo: r.is_demo,
  };
}

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

export async function listPeople(db: DB, filter: PeopleFilter = {}, limit = 500): Promise<Person[]> {
  let q = peopleQuery(db);
  if (filter.organizationId) q = q.where('u.organization_id', '=', filter.organizationId);
  if (filter.role === 'owner') q = q.where('u.role', '=', 'installer').where('u.is_owner', '=', true);
  else if (filter.role) q = q.where('u.role', '=', filter.role);
  if (filter.status === 'active') q = q.where('u.deactivated_at', 'is', null);
  if (filter.status === 'deactivated') q = q.where('u.deactivated_at', 'is not', null);
  if (filter.search) {
    const pattern = `%${escapeLike(filter.search)}%`;
    // Companies and jurisdictions matching by name become lists of ids, so each branch of the OR is on users
    // and can use its own index (trigram indexes on name and e-mail).
    const organizationIds = sql<string[]>`array(${db.selectFrom('organizations').select('id').where('name', 'ilike', pattern)})`;
    const jurisdictionIds = sql<string[]>`array(${db.selectFrom('jurisdictions').select('id').where('name', 'ilike', pattern)})`;
    q = q.where((eb) =>
      eb.or([
        eb('u.name', 'ilike', pattern),
        eb('u.email', 'ilike', pattern),
        eb('u.organization_id', '=', eb.fn.any(organizationIds)),
        eb('u.jurisdiction_id', '=', eb.fn.any(jurisdictionIds)),
      ]),
    );
  }
  const rows = await q.orderBy('u.role').orderBy('u.email').limit(limit).execute();
  return rows.map(toPerson);
}

export async function findPerson(db: DB, id: string): Promise<Person | null> {
  const row = await peopleQuery(db).where('u.id', '=', id).executeTakeFirst();
  return row ? toPerson(row) : null;
}

export async function emailHasAccount(db: DB, email: string): Promise<boolean> {
  const row = await db.selectFrom('users').select('id').where('email', '=', email).executeTakeFirst();
  return !!row;
}

/**
 * Locks what the last-owner and last-admin rules count: the company's row (or, for admins, every admin row),
 * so two owners demoting each other at once are counted one after the other.
 */
export async function lockForPeopleChange(db: DB, target: { organizationId: string | null; role: Role }): Promise<void> {
  if (target.organizationId) {
    await db.selectFrom('organizations').select('id').where('id', '=', target.organizationId).forUpdate().execute();
  } else if (target.role === 'admin') {
    await db.selectFrom('users').select('id').where('role', '=', 'admin').forUpdate().execute();
  }
}

/** Active owners of a company other than `exceptUserId`. */
export async function countOtherActiveOwners(db: DB, organizationId: string, exceptUserId: string): Promise<number> {
  const row = await db
    .selectFrom('users')
    .select(sql<number>`count(*)::int`.as('n'))
    .where('organization_id', '=', organizationId)
    .where('is_owner', '=', true)
    .where('deactivated_at', 'is', null)
    .where('id', '<>', exceptUserId)
    .executeTakeFirstOrThrow();
  return row.n;
}

export async function countOtherActiveAdmins(db: DB, exceptUserId: string): Promise<number> {
  const row = await db
    .selectFrom('users')
    .select(sql<number>`count(*)::int`.as('n'))
    .where('role', '=', 'admin')
    .where('deactivated_at', 'is', null)
    .where('id', '<>', exceptUserId)
    .executeTakeFirstOrThrow();
  return row.n;
}

export async function setOwner(db: DB, userId: string, isOwner: boolean): Promise<void> {
  await db.updateTable('users').set({ is_owner: isOwner, updated_at: new Date() }).where('id', '=', userId).execute();
}

export async function setJurisdiction(db: DB, userId: string, jurisdictionId: string): Promise<void> {
  await db.updateTable('users').set({ jurisdiction_id: jurisdictionId, updated_at: new Date() }).where('id', '=', userId).execute();
}

/**
 * Switches a person off: every live session and API token ends now (the session and token checks also
 * refuse a deactivated person, so nothing slips through between requests). Their records stay.
 */
export async function deactivatePerson(db: DB, userId: string): Promise<{ sessionsEnded: number; tokensRevoked: number }> {
  await db.updateTable('users').set({ deactivated_at: new Date(), updated_at: new Date() }).where('id', '=', userId).execute();
  const sessions = await db.updateTable('sessions').set({ revoked_at: new Date() }).where('user_id', '=', userId).where('revoked_at', 'is', null).executeTakeFirst();
  const tokens = await db.updateTable('api_tokens').set({ revoked_at: new Date() }).where('user_id', '=', userId).where('revoked_at', 'is', null).executeTakeFirst();
  return { sessionsEnded: Number(sessions.numUpdatedRows), tokensRevoked: Number(tokens.numUpdatedRows) };
}

export async function reactivatePerson(db: DB, userId: string): Promise<void> {
  await db.updateTable('users').set({ deactivated_at: null, updated_at: new Date() }).where('id', '=', userId).execute();
}

/** The account an accepted invitation creates; the address is confirmed, since the link reached it. */
export async function insertInvitedUser(
  db: DB,
  input: { email: string; name: string; passwordHash: string; role: Role; isOwner: boolean; organizationId: string | null; jurisdictionId: string | null },
): Promise<string> {
  const row = await db
    .insertInto('users')
    .values({
      email: input.email,
      name: input.name,
      password_hash: input.passwordHash,
      role: input.role,
      is_owner: input.isOwner,
      organization_id: input.organizationId,
      jurisdiction_id: input.jurisdictionId,
      email_confirmed_at: new Date(),
      password_changed_at: new Date(),
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}
