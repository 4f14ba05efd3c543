import { getDb } from '@/db';
import { applianceInputSchema } from '@/lib/domain/appliances/model';
import { ValidationError } from '@/lib/domain/errors';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route, zodErrors } from '@/lib/platform/http';
import { createAppliance, listAppliances } from '@/lib/services/appliances';
import { applianceListRequestQuerySchema } from '@/lib/domain/api/requests';

export const GET = route(async (request) => {
  const user = await requireUser(request, ['installer']);
  const q = applianceListRequestQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!q.success) throw new ValidationError(zodErrors(q.error));
  return json({ items: await listAppliances(getDb(), user, q.data) });
});

export const POST = route(async (request) => {
  const user = await requireUser(request, ['installer']);
  const values = await parseBody(request, applianceInputSchema);
  return json(await createAppliance(getDb(), user, values), 201);
});
