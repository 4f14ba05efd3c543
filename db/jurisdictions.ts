import type { DB } from './index';
import type { JurisdictionRow, PlumbingFamily } from './types';

export type JurisdictionEditions = {
  building: string;
  electrical: string;
  plumbing: string;
  plumbingFamily: PlumbingFamily;
  mechanical: string;
  fuelGas: string;
};

export type Jurisdiction = {
  id: string;
  slug: string;
  name: string;
  region: string;
  editions: JurisdictionEditions;
  inspectorEmail: string | null;
  amendmentNotes: string;
  isDemo: boolean;
};

export function toJurisdiction(row: JurisdictionRow): Jurisdiction {
  return {
    id: row.id,
    slug: row.slug,
    name: row.name,
    region: row.region,
    editions: {
      building: row.building_edition,
      electrical: row.electrical_edition,
      plumbing: row.plumbing_edition,
      plumbingFamily: row.plumbing_family,
      mechanical: row.mechanical_edition,
      fuelGas: row.fuel_gas_edition,
    },
    inspectorEmail: row.inspector_email,
    amendmentNotes: row.amendment_notes,
    isDemo: row.is_demo,
  };
}

export async function listJurisdictions(db: DB): Promise<Jurisdiction[]> {
  const rows = await db.selectFrom('jurisdictions').selectAll().orderBy('name').execute();
  return rows.map(toJurisdiction);
}

export async function findJurisdictionBySlug(db: DB, slug: string): Promise<Jurisdiction | null> {
  const row = await db.selectFrom('jurisdictions').selectAll().where('slug', '=', slug).executeTakeFirst();
  return row ? toJurisdiction(row) : null;
}
