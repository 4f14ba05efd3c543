import 'server-only';
import type { DB } from '@/db';
import { findPublishedVersion, findRuleSetById, type RuleSetWithRules } from '@/db/rule-sets';

// Published and retired versions never change (the database refuses it), so caching them by id is safe.
const cache = new Map<string, RuleSetWithRules>();
const MAX_CACHED = 200;

export async function loadImmutableRuleSet(db: DB, id: string): Promise<RuleSetWithRules | null> {
  const hit = cache.get(id);
  if (hit) return hit;
  const loaded = await findRuleSetById(db, id);
  if (loaded && loaded.status !== 'draft') {
    if (cache.size >= MAX_CACHED) cache.delete(cache.keys().next().value!);
    cache.set(id, loaded);
  }
  return loaded;
}

/** The jurisdiction's published rule set, its rules read from the cache after the first time. */
export async function loadPublishedRuleSet(db: DB, jurisdictionId: string): Promise<RuleSetWithRules | null> {
  const version = await findPublishedVersion(db, jurisdictionId);
  return version ? loadImmutableRuleSet(db, version.id) : null;
}
