import { getDb } from '@/db';
import { runDryRun } from '@/lib/services/rule-sets/comparisons';
import { requireRuleSet } from '@/lib/services/rule-sets/rule-admin';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';

/** Evaluates demo plans and every project's latest plan under the published version and this one; stores nothing. */
export const POST = route<{ params: Promise<{ id: string }> }>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const set = await requireRuleSet(db, (await params).id);
  return json(await runDryRun(db, set.id, user.id));
});
