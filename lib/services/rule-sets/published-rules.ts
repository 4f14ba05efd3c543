import 'server-only';
import type { DB } from '@/db';
import { findVersionByNumber } from '@/db/rule-sets';
import { NotFoundError } from '@/lib/domain/errors';
import { jurisdictionWithPublished } from '@/lib/services/checks/rule-set-cache';
import type { RuleSetForEvaluation } from '@/lib/domain/engine';

export type PublishedRuleSet = Required<RuleSetForEvaluation> & { status: 'published' | 'retired' };

/**
 * One published (or since retired) rule set version as the browser's live check runs it. Such a version
 * never changes, so the answer may be cached for good under its version number; a draft is never served.
 */
export async function getPublishedRuleSet(db: DB, slug: string, version: number): Promise<PublishedRuleSet> {
  const jurisdiction = await jurisdictionWithPublished(db, slug);
  if (!jurisdiction) throw new NotFoundError(`No jurisdiction '${slug}'.`);
  const set = await findVersionByNumber(db, jurisdiction.id, version);
  if (!set || set.status === 'draft') throw new NotFoundError(`${jurisdiction.name} has no published version ${version}.`);
  return { id: set.id, jurisdiction: set.jurisdictionSlug, version: set.version, status: set.status, parameters: set.parameters, rules: set.rules };
}
