import { getDb } from '@/db';
import { acceptInvitationSchema } from '@/lib/domain/accounts/people';
import { signInAs, signedInResponse } from '@/lib/platform/auth/sign-in-as';
import { parseBody, route } from '@/lib/platform/http';
import { clientAddress } from '@/lib/platform/rate-limit';
import { acceptInvitation } from '@/lib/services/accounts/invitations';

// The segment is the invitation's token here (the link in the e-mail), its id on the parent route.
type Ctx = { params: Promise<{ id: string }> };

/** Creates the invited person's account and signs them in. */
export const POST = route<Ctx>(async (request, { params }) => {
  const token = (await params).id;
  const input = await parseBody(request, acceptInvitationSchema);
  const user = await acceptInvitation(getDb(), token, input, { address: clientAddress(request) });
  const cookie = await signInAs(user, request);
  return signedInResponse({ user: { id: user.id, email: user.email, name: user.name, role: user.role, isOwner: user.isOwner } }, 201, cookie);
});
