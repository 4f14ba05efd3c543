import { getDb } from '@/db';
import { findJurisdictionById } from '@/db/jurisdictions';
import { requireRuleSet } from '@/lib/services/rule-sets/rule-admin';
import { discardDraft, saveDraft } from '@/db/rule-sets';
import { citationMismatches } from '@/lib/domain/rule-sets/citations';
import { amendmentErrors } from '@/lib/domain/params/amendments';
import { draftSaveSchema, revisionQuerySchema } from '@/lib/domain/rule-sets/requests';
import { requireUser } from '@/lib/platform/auth/session';
import { ValidationError } from '@/lib/domain/errors';
import { json, parseBody, route, zodErrors } from '@/lib/platform/http';

type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  await requireUser(request, ['admin']);
  const db = getDb();
  const set = await requireRuleSet(db, (await params).id);
  const jurisdiction = await findJurisdictionById(db, set.jurisdictionId);
  return json({ ...set, citationMismatches: jurisdiction ? citationMismatches(set.rules, jurisdiction.editions) : [] });
});

/** Saves a draft's parameters and/or changelog; refused with 409 when someone saved a newer revision. */
export const PATCH = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const set = await requireRuleSet(db, (await params).id);
  const body = await parseBody(request, draftSaveSchema);
  const uncited = body.parameters ? amendmentErrors(body.parameters) : [];
  if (uncited.length) throw new ValidationError(uncited, 'Each value changed from the model code needs its local amendment cited; nothing was saved.');
  return json(await saveDraft(db, { id: set.id, revision: body.revision, parameters: body.parameters, changelog: body.changelog, actorUserId: user.id }));
});

/** Discards a draft: DELETE /api/rule-sets/<id>?revision=<n>. Published and retired versions cannot be deleted. */
export const DELETE = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const set = await requireRuleSet(db, (await params).id);
  const query = revisionQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!query.success) throw new ValidationError(zodErrors(query.error));
  await discardDraft(db, { id: set.id, revision: query.data.revision, actorUserId: user.id });
  return new Response(null, { status: 204 });
});
