import { getDb } from '@/db';
import { NotFoundError } from '@/lib/domain/errors';
import { parsePositiveInt } from '@/lib/domain/integers';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';
import { getPublishedRuleSet } from '@/lib/services/rule-sets/published-rules';

type Ctx = { params: Promise<{ slug: string; version: string }> };

/**
 * A published rule set version for the live check: any signed-in user may read it (the evaluation API
 * applies the same rules). Published versions are immutable, so the browser keeps the answer by URL.
 */
export const GET = route<Ctx>(async (request, { params }) => {
  await requireUser(request);
  const { slug, version: versionText } = await params;
  const version = parsePositiveInt(versionText);
  if (version === null) throw new NotFoundError(`No rule set version '${versionText}'.`);
  const set = await getPublishedRuleSet(getDb(), slug, version);
  return json(set, { headers: { 'cache-control': 'private, max-age=31536000, immutable', etag: `"${set.id}"` } });
});
