import { z } from 'zod';
import { getDb } from '@/db';
import { listAudit } from '@/db/audit';
import { requireUser } from '@/lib/platform/auth/session';
import { ValidationError } from '@/lib/domain/errors';
import { json, route, zodErrors } from '@/lib/platform/http';

const querySchema = z.object({ limit: z.coerce.number().int().min(1).max(500).default(100) });

/** The most recent audit entries across the product, for admins. */
export const GET = route(async (request) => {
  await requireUser(request, ['admin']);
  const parsed = querySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) throw new ValidationError(zodErrors(parsed.error));
  return json(await listAudit(getDb(), parsed.data.limit));
});
