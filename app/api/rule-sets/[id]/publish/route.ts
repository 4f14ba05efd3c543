import { getDb } from '@/db';
import { requireRuleSet } from '@/lib/services/rule-sets/rule-admin';
import { publishDraft } from '@/db/rule-sets';
import { assertPublishable } from '@/lib/domain/rule-sets/publish-check';
import { publishSchema } from '@/lib/domain/rule-sets/requests';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';

/** Publishes the draft revision the admin reviewed; the previous published version is retired with it. */
export const POST = route<{ params: Promise<{ id: string }> }>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const set = await requireRuleSet(db, (await params).id);
  const body = await parseBody(request, publishSchema);
  const result = await publishDraft(db, {
    id: set.id,
    revision: body.revision,
    changelog: body.changelog,
    actorUserId: user.id,
    validate: (draft) => assertPublishable(draft, 'This draft cannot be published yet.'),
  });
  return json(result);
});
