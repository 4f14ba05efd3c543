import { getDb } from '@/db';
import { webhookCreateSchema } from '@/lib/domain/webhooks/schema';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { createWebhook, endpointBody, listWebhooks } from '@/lib/services/webhooks/endpoints';

/** The company's webhook endpoints (installers of the company; never the secrets). */
export const GET = route(async (request) => {
  const user = await requireUser(request, ['installer']);
  return json({ endpoints: (await listWebhooks(getDb(), user)).map(endpointBody) });
});

/** An owner adds an endpoint; the answer shows its signing secret, this once. */
export const POST = route(async (request) => {
  const user = await requireUser(request, ['installer']);
  const input = await parseBody(request, webhookCreateSchema);
  const { endpoint, secret } = await createWebhook(getDb(), user, input);
  return json({ ...endpointBody(endpoint), secret }, 201);
});
