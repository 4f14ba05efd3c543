import { z } from 'zod';
import { getDb } from '@/db';
import { revokeApiToken } from '@/db/api-tokens';
import { requireUser } from '@/lib/platform/auth/session';
import { NotFoundError } from '@/lib/domain/errors';
import { json, route } from '@/lib/platform/http';
import { forgetCachedCopies } from '@/lib/platform/cache/invalidation';

type Ctx = { params: Promise<{ id: string }> };

export const DELETE = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request);
  const id = z.uuid().safeParse((await params).id);
  if (!id.success || !(await revokeApiToken(getDb(), user.id, id.data))) {
    throw new NotFoundError('No live token with that id on your account.');
  }
  // Refused by this server from the next request on, before the database's announcement comes back.
  forgetCachedCopies();
  return json({ revoked: true });
});
