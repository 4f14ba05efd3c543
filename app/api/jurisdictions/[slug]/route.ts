import { getDb } from '@/db';
import { updateJurisdiction } from '@/db/jurisdictions';
import { requireJurisdiction } from '@/lib/services/rule-sets/rule-admin';
import { listVersions } from '@/db/rule-sets';
import { jurisdictionUpdateSchema } from '@/lib/domain/rule-sets/jurisdiction-schema';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';

type Ctx = { params: Promise<{ slug: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  await requireUser(request, ['admin']);
  const db = getDb();
  const jurisdiction = await requireJurisdiction(db, (await params).slug);
  const versions = await listVersions(db, jurisdiction.id);
  return json({ ...jurisdiction, versions: versions.map(({ parameters: _p, ...v }) => v) });
});

export const PATCH = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['admin']);
  const db = getDb();
  const jurisdiction = await requireJurisdiction(db, (await params).slug);
  const input = await parseBody(request, jurisdictionUpdateSchema);
  return json(await updateJurisdiction(db, jurisdiction.id, input, user.id));
});
