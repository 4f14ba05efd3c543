import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';
import { mailStateBody } from '@/lib/services/mail/view';
import { sendMailAgain } from '@/lib/services/mail/outbox';

type Ctx = { params: Promise<{ id: string }> };

/** Puts an e-mail that failed its last attempt back in the queue; 409 while it is still being tried or once sent. */
export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request);
  return json(mailStateBody(await sendMailAgain(getDb(), user, (await params).id)), 202);
});
