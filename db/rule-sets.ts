import type { DB } from './index';
import type { RuleSetStatus } from './types';
import type { RuleSetParameters } from '@/lib/params';
import type { StoredRule } from '@/rules';

export type RuleSetVersion = {
  id: string;
  jurisdictionId: string;
  jurisdictionSlug: string;
  version: number;
  status: RuleSetStatus;
  parameters: RuleSetParameters;
  changelog: string;
  revision: number;
  publishedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
};

export type RuleSetWithRules = RuleSetVersion & { rules: StoredRule[] };

function versionQuery(db: DB) {
  return db
    .selectFrom('rule_sets as s')
    .innerJoin('jurisdictions as j', 'j.id', 's.jurisdiction_id')
    .select([
      's.id', 's.jurisdiction_id', 'j.slug as jurisdiction_slug', 's.version', 's.status', 's.parameters', 's.changelog',
      's.revision', 's.published_at', 's.created_at', 's.updated_at',
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof versionQuery>['executeTakeFirstOrThrow']>>;

function toVersion(r: Row): RuleSetVersion {
  return {
    id: r.id,
    jurisdictionId: r.jurisdiction_id,
    jurisdictionSlug: r.jurisdiction_slug,
    version: r.version,
    status: r.status,
    parameters: r.parameters as RuleSetParameters,
    changelog: r.changelog,
    revision: r.revision,
    publishedAt: r.published_at,
    createdAt: r.created_at,
    updatedAt: r.updated_at,
  };
}

export function ruleToRow(rule: StoredRule, ruleSetId: string, position: number) {
  const { key, title, area, enabled, conditions, ...definition } = rule;
  return {
    rule_set_id: ruleSetId,
    key,
    position,
    title,
    area,
    enabled,
    conditions: JSON.stringify(conditions),
    definition: JSON.stringify(definition),
  };
}

export async function loadRules(db: DB, ruleSetId: string): Promise<StoredRule[]> {
  const rows = await db.selectFrom('rules').selectAll().where('rule_set_id', '=', ruleSetId).orderBy('position').execute();
  return rows.map(
    (r) => ({ ...(r.definition as object), key: r.key, title: r.title, area: r.area, enabled: r.enabled, conditions: r.conditions }) as StoredRule,
  );
}

export async function getRuleSetById(db: DB, id: string): Promise<RuleSetWithRules | null> {
  const row = await versionQuery(db).where('s.id', '=', id).executeTakeFirst();
  if (!row) return null;
  return { ...toVersion(row), rules: await loadRules(db, row.id) };
}

export async function getPublishedVersion(db: DB, jurisdictionId: string): Promise<RuleSetVersion | null> {
  const row = await versionQuery(db).where('s.jurisdiction_id', '=', jurisdictionId).where('s.status', '=', 'published').executeTakeFirst();
  return row ? toVersion(row) : null;
}

export async function getPublishedRuleSet(db: DB, jurisdictionId: string): Promise<RuleSetWithRules | null> {
  const v = await getPublishedVersion(db, jurisdictionId);
  return v ? { ...v, rules: await loadRules(db, v.id) } : null;
}

/** Published version number per jurisdiction id. */
export async function publishedVersionsByJurisdiction(db: DB): Promise<Map<string, number>> {
  const rows = await db.selectFrom('rule_sets').select(['jurisdiction_id', 'version']).where('status', '=', 'published').execute();
  return new Map(rows.map((r) => [r.jurisdiction_id, r.version]));
}

/**
 * Writes a complete version and publishes it in one transaction: the previous published version
 * is retired, and an audit entry records who did it.
 */
export async function createPublishedVersion(
  db: DB,
  input: { jurisdictionId: string; parameters: RuleSetParameters; rules: StoredRule[]; changelog: string; actorUserId: string | null },
): Promise<RuleSetVersion> {
  return db.transaction().execute(async (trx) => {
    const last = await trx
      .selectFrom('rule_sets')
      .select((eb) => eb.fn.max('version').as('v'))
      .where('jurisdiction_id', '=', input.jurisdictionId)
      .executeTakeFirst();
    const version = Number(last?.v ?? 0) + 1;
    const draft = await trx
      .insertInto('rule_sets')
      .values({
        jurisdiction_id: input.jurisdictionId,
        version,
        parameters: JSON.stringify(input.parameters),
        changelog: input.changelog,
        created_by: input.actorUserId,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    if (input.rules.length) {
      await trx.insertInto('rules').values(input.rules.map((r, i) => ruleToRow(r, draft.id, i))).execute();
    }
    const now = new Date();
    await trx
      .updateTable('rule_sets')
      .set({ status: 'retired', retired_at: now })
      .where('jurisdiction_id', '=', input.jurisdictionId)
      .where('status', '=', 'published')
      .execute();
    await trx
      .updateTable('rule_sets')
      .set({ status: 'published', published_at: now, published_by: input.actorUserId })
      .where('id', '=', draft.id)
      .execute();
    await trx
      .insertInto('audit_log')
      .values({
        actor_user_id: input.actorUserId,
        action: 'rule-set.publish',
        entity_type: 'rule_set',
        entity_id: draft.id,
        details: JSON.stringify({ jurisdictionId: input.jurisdictionId, version, changelog: input.changelog }),
      })
      .execute();
    const row = await versionQuery(trx).where('s.id', '=', draft.id).executeTakeFirstOrThrow();
    return toVersion(row);
  });
}
