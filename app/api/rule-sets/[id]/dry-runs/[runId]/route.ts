import { getDb } from '@/db';
import { getDryRun } from '@/lib/services/rule-sets/runs';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';

/** A dry run's state, projects done of the total, and its result once done. */
export const GET = route<{ params: Promise<{ id: string; runId: string }> }>(async (request, { params }) => {
  await requireUser(request, ['admin']);
  const { id, runId } = await params;
  return json(await getDryRun(getDb(), id, runId));
});
