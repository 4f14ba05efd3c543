import 'server-only';
import type { DB } from '@/db';
import { searchInspections } from '@/db/reports';
import { ForbiddenError } from '@/lib/domain/errors';
import type { InspectionFilter } from '@/lib/domain/reports/inspection-filter';
import type { AppUser } from '@/lib/domain/roles';

/** The inspector's queue: reports that reached their jurisdiction's inspector address; administrators see every jurisdiction. */
export async function listInspectionQueue(db: DB, user: AppUser, filter: InspectionFilter) {
  if (user.role !== 'inspector' && user.role !== 'admin') throw new ForbiddenError('Only inspectors and administrators read the inspection queue.');
  return searchInspections(db, { ...filter, jurisdictionId: user.role === 'inspector' ? user.jurisdictionId : null });
}
