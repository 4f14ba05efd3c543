import { getDb } from '@/db';
import { ConflictError, NotFoundError } from '@/lib/domain/errors';
import { json, route } from '@/lib/platform/http';
import { confirmEmail } from '@/lib/services/accounts/email-confirmation';

type Ctx = { params: Promise<{ token: string }> };

/** Confirms the address a link was sent to; whoever holds the link may use it, signed in or not. */
export const POST = route<Ctx>(async (_request, ctx) => {
  const { token } = await ctx.params;
  const { status } = await confirmEmail(getDb(), token);
  if (status === 'unknown') throw new NotFoundError('This confirmation link is not valid. Sign in and send a new one from the Account page.');
  if (status === 'expired') throw new ConflictError('This confirmation link has expired. Sign in and send a new one from the Account page.');
  if (status === 'used') throw new ConflictError('This confirmation link was already used.');
  return json({ confirmed: true });
});
