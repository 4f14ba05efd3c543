import { getDb } from '@/db';
import { dryRunStartSchema } from '@/lib/domain/rule-sets/requests';
import { startDryRun } from '@/lib/services/rule-sets/runs';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';

/** Queues a dry run of this version over the demo plans and every open project; answers at once with the run. */
export const POST = route<{ params: Promise<{ id: string }> }>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const { id } = await params;
  const input = await parseBody(request, dryRunStartSchema);
  const { run, joined } = await startDryRun(getDb(), user, id, input);
  return json({ ...run, joined }, { status: 202, headers: { location: `/api/rule-sets/${id}/dry-runs/${run.id}` } });
});
