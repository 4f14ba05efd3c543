import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';
import { clientAddress } from '@/lib/platform/rate-limit';
import { resendConfirmation } from '@/lib/services/accounts/email-confirmation';

/** Sends the signed-in person a new link to confirm their e-mail address. */
export const POST = route(async (request) => {
  const user = await requireUser(request);
  return json(await resendConfirmation(getDb(), user, { address: clientAddress(request) }), 202);
});
