import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';
import { deliveryBody, sendWebhookDeliveryAgain } from '@/lib/services/webhooks/endpoints';

type Ctx = { params: Promise<{ id: string }> };

/** An owner queues a delivery again after its last attempt failed; 409 while it is still being tried or once delivered. */
export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  return json(deliveryBody(await sendWebhookDeliveryAgain(getDb(), user, (await params).id)), 202);
});
