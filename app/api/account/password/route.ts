import { getDb } from '@/db';
import { passwordChangeSchema } from '@/lib/domain/accounts/forms';
import { requireSessionUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { changePassword } from '@/lib/services/accounts/passwords';

/** Changes the caller's password; only a signed-in browser may, and every other session ends. */
export const POST = route(async (request) => {
  const caller = await requireSessionUser(request, 'Changing a password needs a signed-in browser; an API token cannot do it.');
  const input = await parseBody(request, passwordChangeSchema);
  return json(await changePassword(getDb(), caller, input));
});
