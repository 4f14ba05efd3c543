import { z } from 'zod';
import { getDb } from '@/db';
import { NotFoundError } from '@/lib/domain/errors';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';
import { revokeInvitation } from '@/lib/services/accounts/invitations';

type Ctx = { params: Promise<{ id: string }> };

/** Withdraws a pending invitation; its link stops working at once. */
export const DELETE = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const id = z.uuid().safeParse((await params).id);
  if (!id.success) throw new NotFoundError('No such invitation was sent from here.');
  return json(await revokeInvitation(getDb(), user, id.data));
});
