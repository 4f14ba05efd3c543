import { getDb } from '@/db';
import { listInspections } from '@/db/reports';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';

export const GET = route(async (request) => {
  const user = await requireUser(request, ['inspector', 'admin']);
  return json({ inspections: await listInspections(getDb(), user.role === 'inspector' ? user.jurisdictionId : null) });
});
