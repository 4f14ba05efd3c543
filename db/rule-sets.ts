import type { DB } from '@/db/index';
import { writeAudit } from '@/db/audit';
import { ConflictError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import type { RuleSetStatus } from '@/db/types';
import type { RuleSetParameters } from '@/lib/domain/params';
import { PARAMETERS_SCHEMA_VERSION, upgradeParameters } from '@/lib/domain/params/upgrade';
import type { StoredRule } from '@/lib/domain/rule-format';
import { carryCitationMarks } from '@/db/citation-checks';

export type RuleSetVersion = {
  id: string;
  jurisdictionId: string;
  jurisdictionSlug: string;
  version: number;
  status: RuleSetStatus;
  /** In today's shape, whatever version they were stored with. */
  parameters: RuleSetParameters;
  changelog: string;
  revision: number;
  publishedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
  basedOnId: string | null;
  retiredAt: Date | null;
  createdBy: string | null;
  publishedBy: string | null;
};

export type RuleSetWithRules = RuleSetVersion & { rules: StoredRule[] };

function versionQuery(db: DB) {
  return db
    .selectFrom('rule_sets as s')
    .innerJoin('jurisdictions as j', 'j.id', 's.jurisdiction_id')
    .leftJoin('users as cu', 'cu.id', 's.created_by')
    .leftJoin('users as pu', 'pu.id', 's.published_by')
    .select([
      's.id', 's.jurisdiction_id', 'j.slug as jurisdiction_slug', 's.version', 's.status', 's.parameters', 's.schema_version', 's.changelog',
      's.revision', 's.published_at', 's.created_at', 's.updated_at', 's.based_on_id', 's.retired_at',
      'cu.email as created_by_email', 'pu.email as published_by_email',
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
    // Upgraded here, where the row becomes an app object, so no reader can meet an old shape.
    parameters: upgradeParameters(r.parameters, r.schema_version) as RuleSetParameters,
    changelog: r.changelog,
    revision: r.revision,
    publishedAt: r.published_at,
    createdAt: r.created_at,
    updatedAt: r.updated_at,
    basedOnId: r.based_on_id,
    retiredAt: r.retired_at,
    createdBy: r.created_by_email,
    publishedBy: r.published_by_email,
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

export async function findRuleSetById(db: DB, id: string): Promise<RuleSetWithRules | null> {
  const row = await versionQuery(db).where('s.id', '=', id).executeTakeFirst();
  if (!row) return null;
  return { ...toVersion(row), rules: await loadRules(db, row.id) };
}

export async function findPublishedVersion(db: DB, jurisdictionId: string): Promise<RuleSetVersion | null> {
  const row = await versionQuery(db).where('s.jurisdiction_id', '=', jurisdictionId).where('s.status', '=', 'published').executeTakeFirst();
  return row ? toVersion(row) : null;
}

export async function findPublishedRuleSet(db: DB, jurisdictionId: string): Promise<RuleSetWithRules | null> {
  const v = await findPublishedVersion(db, jurisdictionId);
  return v ? { ...v, rules: await loadRules(db, v.id) } : null;
}

/** Published version number per jurisdiction id. */
export async function publishedVersionsByJurisdiction(db: DB): Promise<Map<string, number>> {
  const rows = await db.selectFrom('rule_sets').select(['jurisdiction_id', 'version']).where('status', '=', 'published').execute();
  return new Map(rows.map((r) => [r.jurisdiction_id, r.version]));
}

/** The next version number of a jurisdiction's rule set (versions never repeat, retired ones included). */
async function nextVersionNumber(db: DB, jurisdictionId: string): Promise<number> {
  const last = await db.selectFrom('rule_sets').select((eb) => eb.fn.max('version').as('v')).where('jurisdiction_id', '=', jurisdictionId).executeTakeFirst();
  return Number(last?.v ?? 0) + 1;
}

/**
 * Writes a complete version and publishes it at once (the seed's first versions): the same draft
 * and publish steps an admin goes through, in one transaction, the previous version retired.
 */
export async function createPublishedVersion(
  db: DB,
  input: { jurisdictionId: string; parameters: RuleSetParameters; rules: StoredRule[]; changelog: string; actorUserId: string | null },
): Promise<RuleSetVersion> {
  return withConflicts(() =>
    db.transaction().execute(async (trx) => {
      const draft = await insertDraft(trx, { jurisdictionId: input.jurisdictionId, parameters: input.parameters, rules: input.rules, basedOnId: null, actorUserId: input.actorUserId, source: 'complete version' });
      await publishWithin(trx, { id: draft.id, revision: draft.revision, changelog: input.changelog, actorUserId: input.actorUserId, validate: () => {} });
      return toVersion(await versionQuery(trx).where('s.id', '=', draft.id).executeTakeFirstOrThrow());
    }),
  );
}

// ---------------------------------------------------------------------------------------------
// Administration: drafts, saves with a revision check, publishing, retiring, version lists.
// Every write runs in one transaction with its audit entry.

export type VersionSummary = RuleSetVersion & { ruleCount: number; enabledCount: number };

/** Every version of one jurisdiction's rule set, newest first. */
export async function listVersions(db: DB, jurisdictionId: string): Promise<VersionSummary[]> {
  const rows = await versionQuery(db).where('s.jurisdiction_id', '=', jurisdictionId).orderBy('s.version', 'desc').execute();
  if (rows.length === 0) return [];
  const counts = await db
    .selectFrom('rules')
    .select((eb) => ['rule_set_id', eb.fn.countAll<number>().as('n'), eb.fn.countAll<number>().filterWhere('enabled', '=', true).as('on')])
    .where('rule_set_id', 'in', rows.map((r) => r.id))
    .groupBy('rule_set_id')
    .execute();
  const byId = new Map(counts.map((c) => [c.rule_set_id, c]));
  return rows.map((r) => ({ ...toVersion(r), ruleCount: Number(byId.get(r.id)?.n ?? 0), enabledCount: Number(byId.get(r.id)?.on ?? 0) }));
}

export async function findVersionByNumber(db: DB, jurisdictionId: string, version: number): Promise<RuleSetWithRules | null> {
  const row = await versionQuery(db).where('s.jurisdiction_id', '=', jurisdictionId).where('s.version', '=', version).executeTakeFirst();
  return row ? { ...toVersion(row), rules: await loadRules(db, row.id) } : null;
}

type PgError = { code?: string; message?: string; constraint?: string };

/** The database's own refusals (immutability triggers, unique versions) become 409s with its message. */
function asConflict(err: unknown): never {
  const e = err as PgError;
  if (e?.code === '23514') throw new ConflictError(`The database refused the change: ${e.message}.`);
  if (e?.code === '23505') {
    throw new ConflictError(
      e.constraint === 'rule_sets_one_published'
        ? 'Another version of this jurisdiction was published at the same moment; reload and try again.'
        : 'Another admin started a draft for this jurisdiction at the same moment; reload to continue theirs.',
    );
  }
  throw err;
}

export async function withConflicts<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (err) {
    return asConflict(err);
  }
}

/**
 * Starts a draft: the next version number, holding a full copy of the given parameters and rules.
 * One open draft per jurisdiction keeps every admin's edits in one place.
 */
export type DraftInput = {
  jurisdictionId: string;
  parameters: RuleSetParameters;
  rules: StoredRule[];
  basedOnId: string | null;
  actorUserId: string | null;
  source: string;
};

/** The draft insert itself, for callers that already hold a transaction (a new jurisdiction's first draft). */
export async function insertDraft(trx: DB, input: DraftInput): Promise<RuleSetVersion> {
  const open = await trx.selectFrom('rule_sets').select('version').where('jurisdiction_id', '=', input.jurisdictionId).where('status', '=', 'draft').executeTakeFirst();
  if (open) throw new ConflictError(`Version ${open.version} is already an open draft for this jurisdiction; continue it, or discard it first.`);
  const version = await nextVersionNumber(trx, input.jurisdictionId);
  const row = await trx
    .insertInto('rule_sets')
    .values({
      jurisdiction_id: input.jurisdictionId,
      version,
      parameters: JSON.stringify(input.parameters),
      schema_version: PARAMETERS_SCHEMA_VERSION,
      based_on_id: input.basedOnId,
      created_by: input.actorUserId,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  if (input.rules.length) await trx.insertInto('rules').values(input.rules.map((r, i) => ruleToRow(r, row.id, i))).execute();
  const carriedMarks = input.basedOnId
    ? await carryCitationMarks(trx, { fromRuleSetId: input.basedOnId, toRuleSetId: row.id, jurisdictionId: input.jurisdictionId, rules: input.rules })
    : 0;
  await writeAudit(trx, {
    actorUserId: input.actorUserId,
    action: 'rule-set.draft.create',
    entityType: 'rule_set',
    entityId: row.id,
    details: { jurisdictionId: input.jurisdictionId, version, source: input.source, basedOnId: input.basedOnId, carriedCitationChecks: carriedMarks },
  });
  return toVersion(await versionQuery(trx).where('s.id', '=', row.id).executeTakeFirstOrThrow());
}

/**
 * Starts a draft: the next version number, holding a full copy of the given parameters and rules.
 * One open draft per jurisdiction keeps every admin's edits in one place.
 */
export async function createDraft(db: DB, input: DraftInput): Promise<RuleSetVersion> {
  return withConflicts(() => db.transaction().execute((trx) => insertDraft(trx, input)));
}

/**
 * Claims the next revision of a draft, or explains why not: the draft is gone, no longer a draft,
 * or someone saved a newer revision since the caller loaded it. The row stays locked until the
 * transaction ends, so concurrent saves queue and exactly one wins each revision.
 */
async function claimRevision(trx: DB, id: string, revision: number): Promise<{ jurisdictionId: string; version: number; revision: number }> {
  const claimed = await trx
    .updateTable('rule_sets')
    .set((eb) => ({ revision: eb('revision', '+', 1), updated_at: new Date() }))
    .where('id', '=', id)
    .where('status', '=', 'draft')
    .where('revision', '=', revision)
    .returning(['jurisdiction_id', 'version', 'revision'])
    .executeTakeFirst();
  if (claimed) return { jurisdictionId: claimed.jurisdiction_id, version: claimed.version, revision: claimed.revision };
  const current = await trx.selectFrom('rule_sets').select(['status', 'version', 'revision', 'updated_at']).where('id', '=', id).executeTakeFirst();
  if (!current) throw new NotFoundError('This draft no longer exists; it may have been discarded.');
  if (current.status !== 'draft') throw new ConflictError(`Version ${current.version} is ${current.status}; it can no longer be changed. Start a new draft.`);
  const last = await trx
    .selectFrom('audit_log as a')
    .leftJoin('users as u', 'u.id', 'a.actor_user_id')
    .select(['u.email', 'a.at'])
    .where('a.entity_type', '=', 'rule_set')
    .where('a.entity_id', '=', id)
    .orderBy('a.id', 'desc')
    .executeTakeFirst();
  const who = last?.email ? ` by ${last.email}` : '';
  throw new ConflictError(
    `This draft was saved${who} at ${current.updated_at.toISOString()} (revision ${current.revision}) after you loaded revision ${revision}. ` +
      'Your change was not saved and nothing of theirs was overwritten: reload the draft, then apply your change again.',
  );
}

export async function saveDraft(
  db: DB,
  input: { id: string; revision: number; parameters?: RuleSetParameters; changelog?: string; actorUserId: string },
): Promise<RuleSetWithRules> {
  await withConflicts(() =>
    db.transaction().execute(async (trx) => {
      const claimed = await claimRevision(trx, input.id, input.revision);
      const set: { parameters?: string; changelog?: string } = {};
      if (input.parameters) set.parameters = JSON.stringify(input.parameters);
      if (input.changelog !== undefined) set.changelog = input.changelog;
      const version = set.parameters ? { schema_version: PARAMETERS_SCHEMA_VERSION } : {};
      if (Object.keys(set).length) await trx.updateTable('rule_sets').set({ ...set, ...version }).where('id', '=', input.id).execute();
      await writeAudit(trx, {
        actorUserId: input.actorUserId,
        action: 'rule-set.draft.save',
        entityType: 'rule_set',
        entityId: input.id,
        details: { jurisdictionId: claimed.jurisdictionId, version: claimed.version, revision: claimed.revision, fields: Object.keys(set) },
      });
    }),
  );
  return (await findRuleSetById(db, input.id))!;
}

export type RuleEdit = { kind: 'add'; rule: StoredRule } | { kind: 'replace'; key: string; rule: StoredRule } | { kind: 'delete'; key: string };

/** Adds, replaces (edits, disables, re-enables) or deletes one rule of a draft. */
export async function editDraftRule(db: DB, input: { id: string; revision: number; edit: RuleEdit; actorUserId: string }): Promise<RuleSetWithRules> {
  await withConflicts(() =>
    db.transaction().execute(async (trx) => {
      const claimed = await claimRevision(trx, input.id, input.revision);
      const { edit } = input;
      const existing = await trx
        .selectFrom('rules')
        .select(['id', 'key', 'position', 'enabled'])
        .where('rule_set_id', '=', input.id)
        .orderBy('position')
        .execute();
      let action: string;
      const key = edit.kind === 'add' ? edit.rule.key : edit.key;
      const current = existing.find((r) => r.key === key);
      if (edit.kind === 'add') {
        if (current) throw new ValidationError([{ path: 'rule.key', message: `This draft already has a rule '${key}'; edit it instead, or choose another key.` }]);
        const position = existing.length ? existing[existing.length - 1].position + 1 : 0;
        await trx.insertInto('rules').values(ruleToRow(edit.rule, input.id, position)).execute();
        action = 'rule-set.rule.add';
      } else {
        if (!current) throw new NotFoundError(`This draft has no rule '${key}'.`);
        if (edit.kind === 'delete') {
          await trx.deleteFrom('rules').where('id', '=', current.id).execute();
          action = 'rule-set.rule.delete';
        } else {
          const row = ruleToRow(edit.rule, input.id, current.position);
          await trx.updateTable('rules').set({ title: row.title, area: row.area, enabled: row.enabled, conditions: row.conditions, definition: row.definition }).where('id', '=', current.id).execute();
          action = current.enabled !== edit.rule.enabled ? (edit.rule.enabled ? 'rule-set.rule.enable' : 'rule-set.rule.disable') : 'rule-set.rule.update';
        }
      }
      await writeAudit(trx, {
        actorUserId: input.actorUserId,
        action,
        entityType: 'rule_set',
        entityId: input.id,
        details: { jurisdictionId: claimed.jurisdictionId, version: claimed.version, revision: claimed.revision, ruleKey: key },
      });
    }),
  );
  return (await findRuleSetById(db, input.id))!;
}

/** Discards an unpublished draft (its rules go with it); published history is untouched. */
export async function discardDraft(db: DB, input: { id: string; revision: number; actorUserId: string }): Promise<void> {
  await withConflicts(() =>
    db.transaction().execute(async (trx) => {
      const claimed = await claimRevision(trx, input.id, input.revision);
      await trx.deleteFrom('rule_sets').where('id', '=', input.id).execute();
      await writeAudit(trx, {
        actorUserId: input.actorUserId,
        action: 'rule-set.draft.discard',
        entityType: 'rule_set',
        entityId: input.id,
        details: { jurisdictionId: claimed.jurisdictionId, version: claimed.version },
      });
    }),
  );
}

/** `validate` throws to refuse; what it returns is recorded with the publish audit entry (e.g. what the admin confirmed). */
type PublishInput = { id: string; revision: number; changelog: string; actorUserId: string | null; validate: (draft: RuleSetWithRules) => void | Record<string, unknown> };

/** The publish steps inside the caller's transaction (also used for a new jurisdiction published at once). */
export async function publishWithin(trx: DB, input: PublishInput): Promise<{ retired: { id: string; version: number } | null }> {
  const claimed = await claimRevision(trx, input.id, input.revision);
  const draft = await findRuleSetById(trx, input.id);
  const confirmed = input.validate(draft!) ?? {};
  const previous = await trx
    .selectFrom('rule_sets')
    .select(['id', 'version'])
    .where('jurisdiction_id', '=', claimed.jurisdictionId)
    .where('status', '=', 'published')
    .forUpdate()
    .executeTakeFirst();
  const now = new Date();
  if (previous) {
    await trx.updateTable('rule_sets').set({ status: 'retired', retired_at: now }).where('id', '=', previous.id).execute();
    await writeAudit(trx, {
      actorUserId: input.actorUserId,
      action: 'rule-set.retire',
      entityType: 'rule_set',
      entityId: previous.id,
      details: { jurisdictionId: claimed.jurisdictionId, version: previous.version, successorId: input.id, successorVersion: claimed.version },
    });
  }
  await trx
    .updateTable('rule_sets')
    .set({ status: 'published', changelog: input.changelog, published_at: now, published_by: input.actorUserId })
    .where('id', '=', input.id)
    .execute();
  await writeAudit(trx, {
    actorUserId: input.actorUserId,
    action: 'rule-set.publish',
    entityType: 'rule_set',
    entityId: input.id,
    details: { jurisdictionId: claimed.jurisdictionId, version: claimed.version, changelog: input.changelog, retiredVersion: previous?.version ?? null, ...confirmed },
  });
  return { retired: previous ?? null };
}

/**
 * Publishes a draft exactly as the admin last saw it (revision check), with its changelog note:
 * the previous published version is retired in the same transaction, and both steps are audited.
 * From then on the database refuses any change to either.
 */
export async function publishDraft(db: DB, input: PublishInput): Promise<{ published: RuleSetVersion; retired: { id: string; version: number } | null }> {
  const result = await withConflicts(() => db.transaction().execute((trx) => publishWithin(trx, input)));
  const published = (await findRuleSetById(db, input.id))!;
  return { published, retired: result.retired };
}
