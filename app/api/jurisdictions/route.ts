import { getDb } from '@/db';
import { listJurisdictions } from '@/db/jurisdictions';
import { createJurisdictionWithDraft } from '@/lib/services/rule-sets/rule-admin';
import { publishedVersionsByJurisdiction } from '@/db/rule-sets';
import { jurisdictionCreateSchema, type JurisdictionListItem } from '@/lib/domain/rule-sets/jurisdiction-schema';
import { publishErrors } from '@/lib/domain/rule-sets/publish-check';
import { ValidationError } from '@/lib/domain/errors';
import { assertUncheckedConfirmed } from '@/lib/services/rule-sets/citations';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';

export const GET = route(async (request) => {
  await requireUser(request);
  const db = getDb();
  const [list, published] = await Promise.all([listJurisdictions(db), publishedVersionsByJurisdiction(db)]);
  return json(
    list.map(
      (j): JurisdictionListItem => ({
        slug: j.slug,
        name: j.name,
        region: j.region,
        editions: j.editions,
        timeZone: j.timeZone,
        publishedVersion: published.get(j.id) ?? null,
      }),
    ),
  );
});

/** Admins add a jurisdiction; its first draft starts from the baseline or another jurisdiction's published rules. */
export const POST = route(async (request) => {
  const user = await requireUser(request, ['admin']);
  const input = await parseBody(request, jurisdictionCreateSchema);
  const { confirm, ...fields } = input;
  const created = await createJurisdictionWithDraft(getDb(), fields, user.id, (draft) => {
    const errors = publishErrors(draft);
    if (errors.length) throw new ValidationError(errors, 'The starting rules cannot be published as they are.');
    // A new draft has no checked citations yet: publishing it at once confirms them unchecked.
    const unchecked = assertUncheckedConfirmed(draft, new Map(), confirm);
    return unchecked.length ? { uncheckedConfirmed: unchecked } : {};
  });
  return json(created, 201);
});
