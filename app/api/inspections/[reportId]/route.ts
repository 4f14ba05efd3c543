import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';
import { loadInspection } from '@/lib/services/reports/inspection';

type Ctx = { params: Promise<{ reportId: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['inspector', 'admin']);
  return json(await loadInspection(getDb(), user, (await params).reportId));
});
