import 'server-only';
import type { DB } from '@/db';
import { findJurisdictionWithPublished } from '@/db/jurisdiction-lookup';
import { findPublishedVersion, findRuleSetById, type RuleSetWithRules } from '@/db/rule-sets';
import { invalidatedCache } from '@/lib/platform/cache/invalidation';

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

export type JurisdictionWithPublished = NonNullable<Awaited<ReturnType<typeof findJurisdictionWithPublished>>>;

// Which version a jurisdiction has published changes on publication; the database announces every rule-set
// and jurisdiction change to every app server (lib/platform/cache/invalidation.ts), which drops these at once.
const jurisdictions = invalidatedCache<JurisdictionWithPublished>({
  max: 1_000,
  ttlMs: 5 * 60_000,
  affects: (event) => event.kind === 'rule-set' || event.kind === 'jurisdiction',
});

/** A jurisdiction by slug with the id of its published version, from memory when this server has it. */
export function jurisdictionWithPublished(db: DB, slug: string): Promise<JurisdictionWithPublished | null> {
  return jurisdictions.get(slug, () => findJurisdictionWithPublished(db, slug));
}
