import { getDb } from '@/db';
import { requireRuleSet } from '@/lib/services/rule-sets/rule-admin';
import { publishRuleSet } from '@/lib/services/rule-sets/citations';
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
  // The successor is published like any draft, unchecked from-memory citations confirmed included.
  const result = await publishRuleSet(db, user, successor, { revision: body.revision, changelog: body.changelog, confirm: body.confirm });
  return json(result);
});
