import { z } from 'zod';
import { getDb } from '@/db';
import { countRecentTokens, createApiToken, listApiTokens } from '@/db/api-tokens';
import { generateApiToken } from '@/lib/platform/auth/api-token';
import { requireUser } from '@/lib/platform/auth/session';
import { TooManyRequestsError } from '@/lib/domain/errors';
import { json, parseBody, route } from '@/lib/platform/http';

const newTokenSchema = z.strictObject({
  name: z.string().trim().min(1, 'Give the token a name, e.g. "office laptop".').max(80, 'Keep the name under 80 characters.'),
});

// Ten new tokens an hour per user is plenty for people and stops a runaway script (common practice).
const TOKENS_PER_HOUR = 10;

export const GET = route(async (request) => {
  const user = await requireUser(request);
  return json({ tokens: await listApiTokens(getDb(), user.id) });
});

export const POST = route(async (request) => {
  const user = await requireUser(request);
  const { name } = await parseBody(request, newTokenSchema);
  const db = getDb();
  if ((await countRecentTokens(db, user.id, 3600_000)) >= TOKENS_PER_HOUR) {
    throw new TooManyRequestsError(`You created ${TOKENS_PER_HOUR} tokens in the last hour; wait before creating another.`, 3600);
  }
  const { token, hash, displayPrefix } = generateApiToken();
  const summary = await createApiToken(db, user.id, name, hash, displayPrefix);
  return json({ token, ...summary }, 201);
});
