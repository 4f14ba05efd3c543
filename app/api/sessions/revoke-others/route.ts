import { getDb } from '@/db';
import { revokeOtherSessions } from '@/db/sessions';
import { requireSessionUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';

/** "Sign out everywhere else": ends every other session of the caller, keeping this browser signed in. */
export const POST = route(async (request) => {
  const { user, sessionId } = await requireSessionUser(request, 'Signing out other sessions needs a signed-in browser; an API token cannot do it.');
  return json({ revoked: await revokeOtherSessions(getDb(), user.id, sessionId) });
});
