import { getDb } from '@/db';
import { findCheck } from '@/db/checks';
import { requireUser } from '@/lib/platform/auth/session';
import { NotFoundError } from '@/lib/domain/errors';
import { json, route } from '@/lib/platform/http';

type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const check = await findCheck(getDb(), user, (await params).id);
  if (!check) throw new NotFoundError('No such check, or its project belongs to another company.');
  return json(check);
});
