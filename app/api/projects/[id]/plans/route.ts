import { getDb } from '@/db';
import { listPlanRevisions } from '@/db/plan-revisions';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { savePlan } from '@/lib/services/plans';
import { planSaveRequestSchema } from '@/lib/domain/api/requests';

type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  return json({ revisions: await listPlanRevisions(getDb(), user, (await params).id) });
});

export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const { plan } = await parseBody(request, planSaveRequestSchema);
  const { revision, changes } = await savePlan(getDb(), user, { projectId: (await params).id, plan });
  return json({ revision, changes }, 201);
});
