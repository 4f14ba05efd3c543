import { sql } from 'kysely';
import type { DB } from '@/db/index';
import { normalizeEmail, toAppUser } from '@/db/users';
import type { AppUser } from '@/lib/domain/roles';

const USER_COLUMNS = ['id', 'email', 'name', 'role', 'organization_id', 'jurisdiction_id', 'is_owner', 'is_demo'] as const;

export type Account = { user: AppUser; emailConfirmedAt: Date | null; deactivatedAt: Date | null };

export async function findAccountByEmail(db: DB, email: string): Promise<Account | null> {
  const row = await db
    .selectFrom('users')
    .select([...USER_COLUMNS, 'email_confirmed_at', 'deactivated_at'])
    .where('email', '=', normalizeEmail(email))
    .executeTakeFirst();
  return row ? { user: toAppUser(row), emailConfirmedAt: row.email_confirmed_at, deactivatedAt: row.deactivated_at } : null;
}

export async function findAccountById(db: DB, userId: string): Promise<Account | null> {
  const row = await db
    .selectFrom('users')
    .select([...USER_COLUMNS, 'email_confirmed_at', 'deactivated_at'])
    .where('id', '=', userId)
    .executeTakeFirst();
  return row ? { user: toAppUser(row), emailConfirmedAt: row.email_confirmed_at, deactivatedAt: row.deactivated_at } : null;
}

export async function emailExists(db: DB, email: string): Promise<boolean> {
  const row = await db.selectFrom('users').select('id').where('email', '=', normalizeEmail(email)).executeTakeFirst();
  return !!row;
}

export async function organizationNameExists(db: DB, name: string): Promise<boolean> {
  const row = await db.selectFrom('organizations').select('id').where(sql<string>`lower(name)`, '=', name.trim().toLowerCase()).executeTakeFirst();
  return !!row;
}

/** A new company and its first person, an installer who owns it; the address is not confirmed yet. */
export async function insertCompanyWithOwner(
  trx: DB,
  input: { company: string; name: string; email: string; passwordHash: string },
): Promise<{ user: AppUser; organizationId: string }> {
  const org = await trx.insertInto('organizations').values({ name: input.company, license_number: null }).returning('id').executeTakeFirstOrThrow();
  const row = await trx
    .insertInto('users')
    .values({
      email: normalizeEmail(input.email),
      name: input.name,
      password_hash: input.passwordHash,
      role: 'installer',
      organization_id: org.id,
      jurisdiction_id: null,
      is_owner: true,
      // Confirmed by the link in the welcome e-mail, not by default.
      email_confirmed_at: null,
      updated_at: new Date(),
    })
    .returning([...USER_COLUMNS])
    .executeTakeFirstOrThrow();
  return { user: toAppUser(row), organizationId: org.id };
}

export async function findPasswordHash(db: DB, userId: string): Promise<string | null> {
  const row = await db.selectFrom('users').select('password_hash').where('id', '=', userId).executeTakeFirst();
  return row?.password_hash ?? null;
}

export async function setPassword(trx: DB, userId: string, passwordHash: string): Promise<void> {
  await trx
    .updateTable('users')
    .set({ password_hash: passwordHash, password_changed_at: sql<Date>`now()`, updated_at: new Date() })
    .where('id', '=', userId)
    .execute();
}

/** Ends the user's live sessions, all of them or all but `keepSessionId`; returns how many ended. */
export async function revokeSessionsOf(trx: DB, userId: string, keepSessionId: string | null): Promise<number> {
  let q = trx
    .updateTable('sessions')
    .set({ revoked_at: new Date() })
    .where('user_id', '=', userId)
    .where('revoked_at', 'is', null)
    .where('expires_at', '>', sql<Date>`now()`);
  if (keepSessionId) q = q.where('id', '<>', keepSessionId);
  const res = await q.executeTakeFirst();
  return Number(res.numUpdatedRows);
}

export async function revokeApiTokensOf(trx: DB, userId: string): Promise<number> {
  const res = await trx.updateTable('api_tokens').set({ revoked_at: new Date() }).where('user_id', '=', userId).where('revoked_at', 'is', null).executeTakeFirst();
  return Number(res.numUpdatedRows);
}

/** Marks the address confirmed; false when it already was. */
export async function markEmailConfirmed(trx: DB, userId: string): Promise<boolean> {
  const res = await trx
    .updateTable('users')
    .set({ email_confirmed_at: sql<Date>`now()`, updated_at: new Date() })
    .where('id', '=', userId)
    .where('email_confirmed_at', 'is', null)
    .executeTakeFirst();
  return Number(res.numUpdatedRows) > 0;
}

export async function isEmailConfirmed(db: DB, userId: string): Promise<boolean> {
  const row = await db.selectFrom('users').select('email_confirmed_at').where('id', '=', userId).executeTakeFirst();
  return !!row?.email_confirmed_at;
}

/** Whether any administrator account exists (the first one is made from the command line). */
export async function countAdmins(db: DB): Promise<number> {
  const row = await db.selectFrom('users').select(sql<string>`count(*)`.as('n')).where('role', '=', 'admin').executeTakeFirstOrThrow();
  return Number(row.n);
}

export async function insertAdmin(db: DB, input: { email: string; name: string; passwordHash: string }): Promise<AppUser> {
  const row = await db
    .insertInto('users')
    .values({
      email: normalizeEmail(input.email),
      name: input.name,
      password_hash: input.passwordHash,
      role: 'admin',
      organization_id: null,
      jurisdiction_id: null,
      // Made by whoever runs the server, who vouches for the address.
      email_confirmed_at: new Date(),
      updated_at: new Date(),
    })
    .returning([...USER_COLUMNS])
    .executeTakeFirstOrThrow();
  return toAppUser(row);
}
