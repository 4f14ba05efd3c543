import { getDb } from '@/db';
import { auditFilterSchema } from '@/lib/domain/accounts/people';
import { requireUser } from '@/lib/platform/auth/session';
import { ValidationError } from '@/lib/domain/errors';
import { json, route, zodErrors } from '@/lib/platform/http';
import { readAudit } from '@/lib/services/accounts/account-audit';

/** The audit entries across the product, newest first, for admins: filter by action, person and dates (YYYY-MM-DD, UTC). */
export const GET = route(async (request) => {
  const user = await requireUser(request, ['admin']);
  const parsed = auditFilterSchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) throw new ValidationError(zodErrors(parsed.error));
  const { rows } = await readAudit(getDb(), user, parsed.data);
  return json(rows);
});
