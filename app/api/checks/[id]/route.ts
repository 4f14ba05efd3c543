import { getDb } from '@/db';
import { findCheck } from '@/db/checks';
import { requireUser } from '@/lib/platform/auth/session';
import { NotFoundError } from '@/lib/domain/errors';
import { json, route } from '@/lib/platform/http';
import { findingCommentsOfCheck } from '@/lib/services/reports/finding-comments';

type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const db = getDb();
  const check = await findCheck(db, user, (await params).id);
  if (!check) throw new NotFoundError('No such check, or its project belongs to another company.');
  // The inspectors' comments per finding (rule key), from every outcome recorded on this check's reports.
  return json({ ...check, inspectorComments: await findingCommentsOfCheck(db, check.id) });
});
