import { z } from 'zod';
import { getDb } from '@/db';
import { createPlanRevision, listPlanRevisions } from '@/db/plan-revisions';
import { requireUser } from '@/lib/platform/auth/session';
import { ValidationError } from '@/lib/domain/errors';
import { json, parseBody, route } from '@/lib/platform/http';
import { parsePlan } from '@/lib/domain/plan';

type Ctx = { params: Promise<{ id: string }> };

const saveSchema = z.strictObject({ plan: z.unknown() });

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  return json({ revisions: await listPlanRevisions(getDb(), user, (await params).id) });
});

export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const { plan } = await parseBody(request, saveSchema);
  const parsed = parsePlan(plan);
  if (!parsed.ok) throw new ValidationError(parsed.errors.map((e) => ({ path: `plan.${e.path}`, message: e.message })));
  const { revision, changes } = await createPlanRevision(getDb(), user, (await params).id, plan, parsed.plan);
  return json({ revision, changes }, 201);
});
