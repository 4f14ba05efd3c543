import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';
import { listCompanyMembers } from '@/lib/services/accounts/people';

/** The people of the caller's company, for its owners. */
export const GET = route(async (request) => {
  const user = await requireUser(request, ['installer']);
  return json({ members: await listCompanyMembers(getDb(), user) });
});
