import { getDb } from '@/db';
import { requireRuleSet } from '@/lib/services/rule-sets/rule-admin';
import { publishRuleSet } from '@/lib/services/rule-sets/citations';
import { publishSchema } from '@/lib/domain/rule-sets/requests';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';

/**
 * Publishes the draft revision the admin reviewed; the previous published version is retired with it.
 * Unchecked from-memory citations answer 409 (needsConfirmation) until the request says `confirm: true`.
 */
export const POST = route<{ params: Promise<{ id: string }> }>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const set = await requireRuleSet(db, (await params).id);
  const body = await parseBody(request, publishSchema);
  return json(await publishRuleSet(db, user, set, body));
});
