import { getDb } from '@/db';
import { webhookUpdateSchema } from '@/lib/domain/webhooks/schema';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { endpointBody, removeWebhook, updateWebhook } from '@/lib/services/webhooks/endpoints';

type Ctx = { params: Promise<{ id: string }> };

/** An owner changes the address, the events, or turns deliveries off and on. */
export const PATCH = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const input = await parseBody(request, webhookUpdateSchema);
  return json(endpointBody(await updateWebhook(getDb(), user, (await params).id, input)));
});

/** An owner removes an endpoint; one that has deliveries is deactivated instead, keeping its history. */
export const DELETE = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const { deleted, endpoint } = await removeWebhook(getDb(), user, (await params).id);
  return json({ deleted, deactivated: !deleted, endpoint: endpoint ? endpointBody(endpoint) : null });
});
