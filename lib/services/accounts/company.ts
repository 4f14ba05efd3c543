import 'server-only';
import type { DB } from '@/db';
import { writeAudit } from '@/db/audit';
import { findJurisdictionBySlug } from '@/db/jurisdictions';
import { findCompanySettings, organizationNameTaken, updateCompanySettings, type CompanySettings } from '@/db/organizations';
import type { CompanySettingsInput } from '@/lib/domain/accounts/forms';
import { ForbiddenError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';

export const OWNERS_ONLY = 'Only an owner of the company can change its settings.';

function companyOf(user: AppUser): string {
  if (user.role !== 'installer' || !user.organizationId) throw new ForbiddenError('Company settings belong to installer companies.');
  return user.organizationId;
}

/** The caller's company details; any installer of the company may read them. */
export async function getCompanySettings(db: DB, user: AppUser): Promise<CompanySettings> {
  const settings = await findCompanySettings(db, companyOf(user));
  if (!settings) throw new NotFoundError('Your company was not found.');
  return settings;
}

/** An owner saves the company's details; the next reports carry the new name and licence number. */
export async function updateCompany(db: DB, user: AppUser, input: CompanySettingsInput): Promise<CompanySettings> {
  const organizationId = companyOf(user);
  if (!user.isOwner) throw new ForbiddenError(OWNERS_ONLY);
  const name = (input.name ?? '').trim();
  const errors = [];
  if (await organizationNameTaken(db, name, organizationId)) {
    errors.push({ path: 'name', message: 'Another company on NookPass already uses this name; add what sets yours apart (a town, a trade).' });
  }
  let defaultJurisdictionId: string | null = null;
  if (input.defaultJurisdiction) {
    const jurisdiction = await findJurisdictionBySlug(db, input.defaultJurisdiction);
    if (!jurisdiction) errors.push({ path: 'defaultJurisdiction', message: 'Choose a jurisdiction from the list, or none.' });
    else defaultJurisdictionId = jurisdiction.id;
  }
  if (errors.length) throw new ValidationError(errors);
  const before = await getCompanySettings(db, user);
  const after = {
    name,
    address: input.address ?? '',
    phone: input.phone ?? '',
    licenseNumber: input.licenseNumber ? input.licenseNumber : null,
    defaultJurisdictionId,
  };
  await db.transaction().execute(async (trx) => {
    await updateCompanySettings(trx, organizationId, after);
    const changed = (Object.keys(after) as (keyof typeof after)[]).filter((k) =>
      k === 'defaultJurisdictionId' ? (before.defaultJurisdiction?.id ?? null) !== after[k] : (before as unknown as Record<string, unknown>)[k] !== after[k],
    );
    await writeAudit(trx, { actorUserId: user.id, action: 'organization.update', entityType: 'organization', entityId: organizationId, organizationId, details: { changed } });
  });
  return getCompanySettings(db, user);
}
