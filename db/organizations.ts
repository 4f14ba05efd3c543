import type { DB } from '@/db/index';

export type Organization = { id: string; name: string; licenseNumber: string | null };

export async function findOrganizationById(db: DB, id: string): Promise<Organization | null> {
  const row = await db.selectFrom('organizations').select(['id', 'name', 'license_number']).where('id', '=', id).executeTakeFirst();
  return row ? { id: row.id, name: row.name, licenseNumber: row.license_number } : null;
}
