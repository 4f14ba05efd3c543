import { getDb } from '@/db';
import { listJurisdictionAudit } from '@/db/audit';
import { requireJurisdiction } from '@/lib/services/rule-sets/rule-admin';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';

export const GET = route<{ params: Promise<{ slug: string }> }>(async (request, { params }) => {
  await requireUser(request, ['admin']);
  const db = getDb();
  const jurisdiction = await requireJurisdiction(db, (await params).slug);
  return json(await listJurisdictionAudit(db, jurisdiction.id, 200));
});
