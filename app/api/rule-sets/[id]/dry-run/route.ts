import { getDb } from '@/db';
import { requireRuleSet, runDryRun } from '@/db/rule-admin';
import { requireUser } from '@/lib/auth/session';
import { json, route } from '@/lib/http';

/** Evaluates demo plans and every project's latest plan under the published version and this one; stores nothing. */
export const POST = route<{ params: Promise<{ id: string }> }>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const set = await requireRuleSet(db, (await params).id);
  return json(await runDryRun(db, set.id, user.id));
});
