import { getDb } from '@/db';
import { listUsers } from '@/db/users';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';

export const GET = route(async (request) => {
  await requireUser(request, ['admin']);
  return json({ users: await listUsers(getDb()) });
});
