import { getDb } from '@/db';
import { listJurisdictions } from '@/db/jurisdictions';
import { requireUser } from '@/lib/auth/session';
import { json, route } from '@/lib/http';

export const GET = route(async (request) => {
  await requireUser(request);
  const list = await listJurisdictions(getDb());
  return json(
    list.map((j) => ({
      slug: j.slug,
      name: j.name,
      region: j.region,
      editions: j.editions,
      publishedVersion: null as number | null,
    })),
  );
});
