import { getDb } from '@/db';
import { impactRunStartSchema } from '@/lib/domain/rule-sets/requests';
import { requireJurisdiction } from '@/lib/services/rule-sets/rule-admin';
import { startImpactRun } from '@/lib/services/rule-sets/runs';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';

/** Queues an impact run of the published version over every open project; answers at once with the run. */
export const POST = route<{ params: Promise<{ slug: string }> }>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const jurisdiction = await requireJurisdiction(db, (await params).slug);
  const input = await parseBody(request, impactRunStartSchema);
  const { run, joined } = await startImpactRun(db, user, jurisdiction, input);
  return json({ ...run, joined }, { status: 202, headers: { location: `/api/jurisdictions/${jurisdiction.slug}/impact-runs/${run.id}` } });
});
