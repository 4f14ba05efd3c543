import { getDb } from '@/db';
import { requireJurisdiction, resolveDraftSource } from '@/lib/services/rule-sets/rule-admin';
import { createDraft, listVersions } from '@/db/rule-sets';
import { draftCreateSchema } from '@/lib/domain/rule-sets/requests';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';

type Ctx = { params: Promise<{ slug: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  await requireUser(request, ['admin']);
  const db = getDb();
  const jurisdiction = await requireJurisdiction(db, (await params).slug);
  return json((await listVersions(db, jurisdiction.id)).map(({ parameters: _p, ...v }) => v));
});

/** Starts the jurisdiction's draft: a full copy of the published version, the baseline, or a chosen version. */
export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const jurisdiction = await requireJurisdiction(db, (await params).slug);
  const body = await parseBody(request, draftCreateSchema);
  const source = body.from === 'version' ? { from: 'version' as const, ruleSetId: body.ruleSetId! } : { from: body.from };
  const start = await resolveDraftSource(db, jurisdiction, source);
  const draft = await createDraft(db, { jurisdictionId: jurisdiction.id, ...start, actorUserId: user.id, source: start.label });
  return json(draft, 201);
});
