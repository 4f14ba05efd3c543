import { getDb } from '@/db';
import { listJurisdictions } from '@/db/jurisdictions';
import { publishedVersionsByJurisdiction } from '@/db/rule-sets';
import { requireUser } from '@/lib/auth/session';
import { json, route } from '@/lib/http';

export const GET = route(async (request) => {
  await requireUser(request);
  const db = getDb();
  const [list, published] = await Promise.all([listJurisdictions(db), publishedVersionsByJurisdiction(db)]);
  return json(
    list.map((j) => ({
      slug: j.slug,
      name: j.name,
      region: j.region,
      editions: j.editions,
      publishedVersion: published.get(j.id) ?? null,
    })),
  );
});
