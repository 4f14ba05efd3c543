import { getDb } from '@/db';
import { ValidationError } from '@/lib/domain/errors';
import { webhookDeliveriesQuerySchema } from '@/lib/domain/webhooks/schema';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route, zodErrors } from '@/lib/platform/http';
import { deliveryBody, listEndpointDeliveries } from '@/lib/services/webhooks/endpoints';

type Ctx = { params: Promise<{ id: string }> };

/** The endpoint's latest deliveries with their state, newest first (installers of the company). */
export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const parsed = webhookDeliveriesQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) throw new ValidationError(zodErrors(parsed.error));
  const deliveries = await listEndpointDeliveries(getDb(), user, (await params).id, parsed.data.limit);
  return json({ deliveries: deliveries.map(deliveryBody) });
});
