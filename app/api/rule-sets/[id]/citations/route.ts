import { getDb } from '@/db';
import { requireRuleSet } from '@/lib/services/rule-sets/rule-admin';
import { listCitationStatuses, markCitation } from '@/lib/services/rule-sets/citations';
import { citationCheckSchema } from '@/lib/domain/rule-sets/citation-checks';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';

type Ctx = { params: Promise<{ id: string }> };

/** Each citation of a version with whether the jurisdiction checked it against the adopted text. */
export const GET = route<Ctx>(async (request, { params }) => {
  await requireUser(request, ['admin']);
  const db = getDb();
  const set = await requireRuleSet(db, (await params).id);
  return json(await listCitationStatuses(db, set));
});

/** Marks one citation of a draft checked (who, when, against what), or withdraws the mark; appended, never edited. */
export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const set = await requireRuleSet(db, (await params).id);
  const body = await parseBody(request, citationCheckSchema);
  return json(await markCitation(db, user, set, body), 201);
});
