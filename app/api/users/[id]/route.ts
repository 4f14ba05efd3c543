import { z } from 'zod';
import { getDb } from '@/db';
import { personUpdateSchema } from '@/lib/domain/accounts/people';
import { NotFoundError } from '@/lib/domain/errors';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { updatePerson } from '@/lib/services/accounts/people';

type Ctx = { params: Promise<{ id: string }> };

/** Changes a person's company role, active state or (admins) an inspector's jurisdiction. */
export const PATCH = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const id = z.uuid().safeParse((await params).id);
  const change = await parseBody(request, personUpdateSchema);
  if (!id.success) throw new NotFoundError('No such person in your company.');
  return json({ person: await updatePerson(getDb(), user, id.data, change) });
});
