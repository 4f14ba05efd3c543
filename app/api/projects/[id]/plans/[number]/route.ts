import { getDb } from '@/db';
import { findPlanRevision } from '@/db/plan-revisions';
import { requireUser } from '@/lib/platform/auth/session';
import { NotFoundError } from '@/lib/domain/errors';
import { json, route } from '@/lib/platform/http';
import { parsePositiveInt } from '@/lib/domain/integers';

type Ctx = { params: Promise<{ id: string; number: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const { id, number } = await params;
  const n = number === 'latest' ? 'latest' : parsePositiveInt(number);
  if (n === null) throw new NotFoundError('Plan revisions are numbered 1, 2, 3…');
  const revision = await findPlanRevision(getDb(), user, id, n);
  if (!revision) throw new NotFoundError('This project has no such plan revision.');
  return json(revision);
});
