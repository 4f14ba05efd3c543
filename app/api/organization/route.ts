import { getDb } from '@/db';
import { companySettingsSchema } from '@/lib/domain/accounts/forms';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { ForbiddenError } from '@/lib/domain/errors';
import { OWNERS_ONLY, getCompanySettings, updateCompany } from '@/lib/services/accounts/company';

/** The caller's company details (installers of the company). */
export const GET = route(async (request) => {
  const user = await requireUser(request, ['installer']);
  return json(await getCompanySettings(getDb(), user));
});

/** An owner changes the company's details. */
export const PATCH = route(async (request) => {
  const user = await requireUser(request, ['installer']);
  if (!user.isOwner) throw new ForbiddenError(OWNERS_ONLY);
  const input = await parseBody(request, companySettingsSchema);
  return json(await updateCompany(getDb(), user, input));
});
