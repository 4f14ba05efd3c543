import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';
import { endpointBody, rotateWebhookSecret } from '@/lib/services/webhooks/endpoints';

type Ctx = { params: Promise<{ id: string }> };

/** An owner replaces the endpoint's signing secret; the answer shows the new one, this once. */
export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const { endpoint, secret } = await rotateWebhookSecret(getDb(), user, (await params).id);
  return json({ ...endpointBody(endpoint), secret });
});
