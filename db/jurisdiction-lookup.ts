import type { DB } from '@/db/index';

/** A jurisdiction and the id of its published rule set version, in one query (the evaluation API's hot path). */
export async function findJurisdictionWithPublished(db: DB, slug: string): Promise<{ id: string; slug: string; name: string; publishedRuleSetId: string | null } | null> {
  const row = await db
    .selectFrom('jurisdictions as j')
    .leftJoin('rule_sets as s', (join) => join.onRef('s.jurisdiction_id', '=', 'j.id').on('s.status', '=', 'published'))
    .select(['j.id', 'j.slug', 'j.name', 's.id as rule_set_id'])
    .where('j.slug', '=', slug)
    .executeTakeFirst();
  return row ? { id: row.id, slug: row.slug, name: row.name, publishedRuleSetId: row.rule_set_id } : null;
}
