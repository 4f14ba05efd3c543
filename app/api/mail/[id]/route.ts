import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';
import { mailStateBody } from '@/lib/services/mail/view';
import { getMailState } from '@/lib/services/mail/outbox';

type Ctx = { params: Promise<{ id: string }> };

/** The delivery state of one e-mail: queued, sending, failed and retrying (attempts so far), sent or failed. */
export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request);
  return json(mailStateBody(await getMailState(getDb(), user, (await params).id)));
});
