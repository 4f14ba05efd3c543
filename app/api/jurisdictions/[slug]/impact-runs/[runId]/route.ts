import { getDb } from '@/db';
import { requireJurisdiction } from '@/lib/services/rule-sets/rule-admin';
import { getImpactRun } from '@/lib/services/rule-sets/runs';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';

/** An impact run's state, projects done of the total, and its result once done. */
export const GET = route<{ params: Promise<{ slug: string; runId: string }> }>(async (request, { params }) => {
  await requireUser(request, ['admin']);
  const db = getDb();
  const { slug, runId } = await params;
  const jurisdiction = await requireJurisdiction(db, slug);
  return json(await getImpactRun(db, jurisdiction, runId));
});
