import type { DB } from '@/db/index';
import type { UserRow } from '@/db/types';
import type { AppUser } from '@/lib/domain/roles';

export function toAppUser(row: Pick<UserRow, 'id' | 'email' | 'name' | 'role' | 'organization_id' | 'jurisdiction_id' | 'is_owner' | 'is_demo'>): AppUser {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    organizationId: row.organization_id,
    jurisdictionId: row.jurisdiction_id,
    isOwner: row.is_owner,
    isDemo: row.is_demo,
  };
}

export function normalizeEmail(email: string): string {
  return email.trim().toLowerCase();
}

export async function findUserForSignIn(db: DB, email: string) {
  const row = await db.selectFrom('users').selectAll().where('email', '=', normalizeEmail(email)).executeTakeFirst();
  return row ? { user: toAppUser(row), passwordHash: row.password_hash, isDeactivated: row.deactivated_at !== null } : null;
}

/** Swaps a verified password's hash for a stronger one, unless the password changed in the meantime. */
export async function replacePasswordHash(db: DB, userId: string, oldHash: string, newHash: string): Promise<void> {
  await db
    .updateTable('users')
    .set({ password_hash: newHash, updated_at: new Date() })
    .where('id', '=', userId)
    .where('password_hash', '=', oldHash)
    .execute();
}

export async function findUserById(db: DB, id: string): Promise<AppUser | null> {
  const row = await db.selectFrom('users').selectAll().where('id', '=', id).executeTakeFirst();
  return row ? toAppUser(row) : null;
}

export type UserListItem = AppUser & { organizationName: string | null; jurisdictionName: string | null; createdAt: Date };

export async function listUsers(db: DB): Promise<UserListItem[]> {
  const rows = await db
    .selectFrom('users as u')
    .leftJoin('organizations as o', 'o.id', 'u.organization_id')
    .leftJoin('jurisdictions as j', 'j.id', 'u.jurisdiction_id')
    .select([
      'u.id', 'u.email', 'u.name', 'u.role', 'u.organization_id', 'u.jurisdiction_id', 'u.is_owner', 'u.is_demo', 'u.created_at',
      'o.name as organization_name', 'j.name as jurisdiction_name',
    ])
    .orderBy('u.role')
    .orderBy('u.email')
    .execute();
  return rows.map((r) => ({
    ...toAppUser(r),
    organizationName: r.organization_name,
    jurisdictionName: r.jurisdiction_name,
    createdAt: r.created_at,
  }));
}

