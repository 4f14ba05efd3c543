import { getDb } from '@/db';
import { requireRuleSet } from '@/lib/services/rule-sets/rule-admin';
import { publishDraft } from '@/db/rule-sets';
import { assertPublishable } from '@/lib/domain/rule-sets/publish-check';
import { retireSchema } from '@/lib/domain/rule-sets/requests';
import { requireUser } from '@/lib/platform/auth/session';
import { ConflictError, ValidationError } from '@/lib/domain/errors';
import { json, parseBody, route } from '@/lib/platform/http';

/**
 * Retires the published version by publishing its successor in the same transaction. A
 * jurisdiction is never left without published rules, so a retire without a successor is refused.
 */
export const POST = route<{ params: Promise<{ id: string }> }>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const set = await requireRuleSet(db, (await params).id);
  if (set.status === 'draft') throw new ConflictError(`Version ${set.version} is a draft; discard it instead of retiring it.`);
  if (set.status === 'retired') throw new ConflictError(`Version ${set.version} is already retired.`);
  const body = await parseBody(request, retireSchema);
  const successor = await requireRuleSet(db, body.successorId).catch(() => null);
  if (!successor || successor.jurisdictionId !== set.jurisdictionId || successor.status !== 'draft') {
    throw new ValidationError([{ path: 'successorId', message: `The successor must be an open draft of ${set.jurisdictionSlug}.` }]);
  }
  const result = await publishDraft(db, {
    id: successor.id,
    revision: body.revision,
    changelog: body.changelog,
    actorUserId: user.id,
    validate: (draft) => assertPublishable(draft, 'The successor cannot be published yet.'),
  });
  return json(result);
});
