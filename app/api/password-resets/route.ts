import { after } from 'next/server';
import { getDb } from '@/db';
import { passwordResetRequestSchema } from '@/lib/domain/accounts/forms';
import { json, parseBody, route } from '@/lib/platform/http';
import { clientAddress } from '@/lib/platform/rate-limit';
import { RESET_REQUESTED_BODY, requestPasswordReset } from '@/lib/services/accounts/passwords';

/** Always 202 with the same body: the answer never tells whether the address has an account. */
export const POST = route(async (request) => {
  const { email } = await parseBody(request, passwordResetRequestSchema);
  const { deliver } = await requestPasswordReset(getDb(), email, { address: clientAddress(request) });
  // The e-mail leaves after the answer, so a known address does not answer later than an unknown one.
  if (deliver) after(deliver);
  return json(RESET_REQUESTED_BODY, 202);
});
