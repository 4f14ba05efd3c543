import { getDb } from '@/db';
import { invitationSchema } from '@/lib/domain/accounts/people';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { clientAddress } from '@/lib/platform/rate-limit';
import { listPendingInvitations, sendInvitation } from '@/lib/services/accounts/invitations';

/** Invitations not yet accepted or revoked, sent from the caller's company (owners) or by the administrators. */
export const GET = route(async (request) => {
  const user = await requireUser(request, ['installer', 'admin']);
  return json({ invitations: await listPendingInvitations(getDb(), user) });
});

export const POST = route(async (request) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const input = await parseBody(request, invitationSchema);
  const invitation = await sendInvitation(getDb(), user, input, { address: clientAddress(request) });
  return json(invitation, 201);
});
