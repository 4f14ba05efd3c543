import { getDb } from '@/db';
import { signUpSchema } from '@/lib/domain/accounts/forms';
import { signInAs, signedInResponse } from '@/lib/platform/auth/sign-in-as';
import { parseBody, route } from '@/lib/platform/http';
import { clientAddress } from '@/lib/platform/rate-limit';
import { signUpCompany } from '@/lib/services/accounts/sign-up';

/** A new installer company with its first person as owner, signed in at once. */
export const POST = route(async (request) => {
  const input = await parseBody(request, signUpSchema);
  const result = await signUpCompany(getDb(), input, { address: clientAddress(request) });
  const cookie = await signInAs(result.user, request);
  return signedInResponse(
    { user: result.user, organization: { id: result.organizationId, name: input.company }, emailConfirmed: false, welcomeMail: result.welcomeMail },
    201,
    cookie,
  );
});
