import type { DB } from '@/db/index';

export type Organization = { id: string; name: string; licenseNumber: string | null };

export async function findOrganizationById(db: DB, id: string): Promise<Organization | null> {
  const row = await db.selectFrom('organizations').select(['id', 'name', 'license_number']).where('id', '=', id).executeTakeFirst();
  return row ? { id: row.id, name: row.name, licenseNumber: row.license_number } : null;
}

export type CompanySettings = {
  id: string;
  name: string;
  address: string;
  phone: string;
  licenseNumber: string | null;
  defaultJurisdiction: { id: string; slug: string; name: string } | null;
};

export async function findCompanySettings(db: DB, id: string): Promise<CompanySettings | null> {
  const row = await db
    .selectFrom('organizations as o')
    .leftJoin('jurisdictions as j', 'j.id', 'o.default_jurisdiction_id')
    .select(['o.id', 'o.name', 'o.address', 'o.phone', 'o.license_number', 'j.id as jurisdiction_id', 'j.slug as jurisdiction_slug', 'j.name as jurisdiction_name'])
    .where('o.id', '=', id)
    .executeTakeFirst();
  if (!row) return null;
  return {
    id: row.id,
    name: row.name,
    address: row.address,
    phone: row.phone,
    licenseNumber: row.license_number,
    defaultJurisdiction: row.jurisdiction_id && row.jurisdiction_slug && row.jurisdiction_name
      ? { id: row.jurisdiction_id, slug: row.jurisdiction_slug, name: row.jurisdiction_name }
      : null,
  };
}

export async function updateCompanySettings(
  trx: DB,
  id: string,
  fields: { name: string; address: string; phone: string; licenseNumber: string | null; defaultJurisdictionId: string | null },
): Promise<void> {
  await trx
    .updateTable('organizations')
    .set({
      name: fields.name,
      address: fields.address,
      phone: fields.phone,
      license_number: fields.licenseNumber,
      default_jurisdiction_id: fields.defaultJurisdictionId,
      updated_at: new Date(),
    })
    .where('id', '=', id)
    .execute();
}

/** Another company already using this name (names are unique, compared without case). */
export async function organizationNameTaken(db: DB, name: string, exceptId: string): Promise<boolean> {
  const row = await db
    .selectFrom('organizations')
    .select('id')
    .where((eb) => eb(eb.fn('lower', ['name']), '=', name.trim().toLowerCase()))
    .where('id', '<>', exceptId)
    .executeTakeFirst();
  return !!row;
}
