import { z } from 'zod';
import { getDb } from '@/db';
import { revokeApiToken } from '@/db/api-tokens';
import { requireUser } from '@/lib/platform/auth/session';
import { NotFoundError } from '@/lib/domain/errors';
import { json, route } from '@/lib/platform/http';

type Ctx = { params: Promise<{ id: string }> };

export const DELETE = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request);
  const id = z.uuid().safeParse((await params).id);
  if (!id.success || !(await revokeApiToken(getDb(), user.id, id.data))) {
    throw new NotFoundError('No live token with that id on your account.');
  }
  return json({ revoked: true });
});
