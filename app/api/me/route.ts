import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';

export const GET = route(async (request) => {
  const user = await requireUser(request);
  return json({ user });
});
