import { getDb } from '@/db';
import { requireRuleSet } from '@/lib/services/rule-sets/rule-admin';
import { editDraftRule } from '@/db/rule-sets';
import { revisionQuerySchema, ruleSaveSchema } from '@/lib/domain/rule-sets/requests';
import { parseRuleInput } from '@/lib/domain/rule-sets/rule-input';
import { requireUser } from '@/lib/platform/auth/session';
import { ValidationError } from '@/lib/domain/errors';
import { json, parseBody, route, zodErrors } from '@/lib/platform/http';

type Ctx = { params: Promise<{ id: string; key: string }> };

/** Replaces one rule of a draft (edit, disable, re-enable). The key is stable: a new key is a new rule. */
export const PUT = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const { id, key } = await params;
  const db = getDb();
  const set = await requireRuleSet(db, id);
  const body = await parseBody(request, ruleSaveSchema);
  const parsed = parseRuleInput(body.rule);
  if (!parsed.ok) throw new ValidationError(parsed.errors);
  const ruleKey = decodeURIComponent(key);
  if (parsed.rule.key !== ruleKey) {
    throw new ValidationError([{ path: 'rule.key', message: `Rule keys are stable: this rule is '${ruleKey}'. Add a new rule for a new key.` }]);
  }
  return json(await editDraftRule(db, { id: set.id, revision: body.revision, edit: { kind: 'replace', key: ruleKey, rule: parsed.rule }, actorUserId: user.id }));
});

/** Removes a rule from a draft: DELETE …/rules/<key>?revision=<n>. To keep a rule but stop it running, disable it. */
export const DELETE = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const { id, key } = await params;
  const db = getDb();
  const set = await requireRuleSet(db, id);
  const query = revisionQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!query.success) throw new ValidationError(zodErrors(query.error));
  return json(await editDraftRule(db, { id: set.id, revision: query.data.revision, edit: { kind: 'delete', key: decodeURIComponent(key) }, actorUserId: user.id }));
});
