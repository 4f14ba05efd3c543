import { getDb } from '@/db';
import { requireRuleSet } from '@/lib/services/rule-sets/rule-admin';
import { diffRuleSets } from '@/lib/domain/rule-sets/diff';
import { requireUser } from '@/lib/platform/auth/session';
import { ValidationError } from '@/lib/domain/errors';
import { json, route } from '@/lib/platform/http';

/** GET /api/rule-sets/<id>/diff?against=<other id>: what changed from the other version to this one. */
export const GET = route<{ params: Promise<{ id: string }> }>(async (request, { params }) => {
  await requireUser(request, ['admin']);
  const db = getDb();
  const to = await requireRuleSet(db, (await params).id);
  const against = new URL(request.url).searchParams.get('against');
  if (!against) throw new ValidationError([{ path: 'against', message: 'Name the version to compare with (?against=<rule set id>).' }]);
  const from = await requireRuleSet(db, against);
  const meta = (s: typeof to) => ({ id: s.id, jurisdiction: s.jurisdictionSlug, version: s.version, status: s.status });
  return json({ from: meta(from), to: meta(to), diff: diffRuleSets(from, to) });
});
