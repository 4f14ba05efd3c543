import { getDb } from '@/db';
import { passwordResetSchema } from '@/lib/domain/accounts/forms';
import { parseBody, route } from '@/lib/platform/http';
import { resetPassword } from '@/lib/services/accounts/passwords';

type Ctx = { params: Promise<{ token: string }> };

/** Sets a new password from a reset link; every session of the person ends. */
export const POST = route<Ctx>(async (request, ctx) => {
  const { token } = await ctx.params;
  const input = await parseBody(request, passwordResetSchema);
  await resetPassword(getDb(), token, input);
  return new Response(null, { status: 204, headers: { 'cache-control': 'no-store' } });
});
