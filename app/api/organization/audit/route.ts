import { getDb } from '@/db';
import { auditFilterSchema } from '@/lib/domain/accounts/people';
import { ValidationError } from '@/lib/domain/errors';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route, zodErrors } from '@/lib/platform/http';
import { readAudit } from '@/lib/services/accounts/account-audit';

/** Account events of the caller's company (invitations, role changes, deactivations, sign-ins), for its owners. */
export const GET = route(async (request) => {
  const user = await requireUser(request, ['installer']);
  const parsed = auditFilterSchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) throw new ValidationError(zodErrors(parsed.error));
  const { rows } = await readAudit(getDb(), user, parsed.data);
  return json({ entries: rows });
});
