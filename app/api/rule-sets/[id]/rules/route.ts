import { getDb } from '@/db';
import { requireRuleSet } from '@/lib/services/rule-sets/rule-admin';
import { editDraftRule } from '@/db/rule-sets';
import { ruleSaveSchema } from '@/lib/domain/rule-sets/requests';
import { parseRuleInput } from '@/lib/domain/rule-sets/rule-input';
import { requireUser } from '@/lib/platform/auth/session';
import { ValidationError } from '@/lib/domain/errors';
import { json, parseBody, route } from '@/lib/platform/http';

/** Adds a rule to a draft; its conditions are checked against the fact catalog before anything is saved. */
export const POST = route<{ params: Promise<{ id: string }> }>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const set = await requireRuleSet(db, (await params).id);
  const body = await parseBody(request, ruleSaveSchema);
  const parsed = parseRuleInput(body.rule);
  if (!parsed.ok) throw new ValidationError(parsed.errors);
  return json(await editDraftRule(db, { id: set.id, revision: body.revision, edit: { kind: 'add', rule: parsed.rule }, actorUserId: user.id }), 201);
});
