import { getDb } from '@/db';
import { applianceUpdateSchema, type ApplianceUpdate } from '@/lib/domain/appliances/model';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { changeAppliance, getAppliance, removeAppliance } from '@/lib/services/appliances';

type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  return json(await getAppliance(getDb(), user, (await params).id));
});

export const PATCH = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const change = (await parseBody(request, applianceUpdateSchema)) as ApplianceUpdate;
  return json(await changeAppliance(getDb(), user, (await params).id, change));
});

export const DELETE = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  await removeAppliance(getDb(), user, (await params).id);
  return new Response(null, { status: 204 });
});
