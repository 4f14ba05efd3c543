import { requireUser } from '@/lib/auth/session';
import { json, route } from '@/lib/http';

export const GET = route(async (request) => {
  const user = await requireUser(request);
  return json({ user });
});
