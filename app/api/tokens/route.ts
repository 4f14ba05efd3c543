import { getDb } from '@/db';
import { createApiTokenWithinLimit, listApiTokens } from '@/db/api-tokens';
import { generateApiToken } from '@/lib/platform/auth/api-token';
import { newTokenSchema } from '@/lib/platform/auth/api-token-form';
import { requireSessionUser, requireUser } from '@/lib/platform/auth/session';
import { TooManyRequestsError } from '@/lib/domain/errors';
import { json, parseBody, route } from '@/lib/platform/http';

// Ten new tokens an hour per user is plenty for people and stops a runaway script (common practice).
const TOKENS_PER_HOUR = 10;

export const GET = route(async (request) => {
  const user = await requireUser(request);
  return json({ tokens: await listApiTokens(getDb(), user.id) });
});

// Only a signed-in browser makes tokens: a token that could mint tokens would outlive its own revocation.
export const POST = route(async (request) => {
  const { user } = await requireSessionUser(request, 'An API token cannot create API tokens. Sign in and create one on the Account page.');
  const { name, expiresInDays } = await parseBody(request, newTokenSchema);
  const { token, hash, displayPrefix } = generateApiToken();
  const result = await createApiTokenWithinLimit(getDb(), user.id, { name, tokenHash: hash, prefix: displayPrefix, expiresInDays }, TOKENS_PER_HOUR);
  if (!result.created) {
    throw new TooManyRequestsError(`You created ${TOKENS_PER_HOUR} tokens in the last hour; wait before creating another.`, result.retryAfterSeconds);
  }
  return json({ token, ...result.token }, 201);
});
