import 'server-only';
import type { DB } from '@/db';
import { writeAudit } from '@/db/audit';
import { findJurisdictionBySlug, insertJurisdiction, type Jurisdiction, type JurisdictionFields } from '@/db/jurisdictions';
import { findPublishedRuleSet, findRuleSetById, insertDraft, publishWithin, withConflicts, type RuleSetVersion, type RuleSetWithRules } from '@/db/rule-sets';
import { ConflictError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import { isUuid } from '@/lib/domain/ids';
import type { RuleSetParameters } from '@/lib/domain/params';
import type { StoredRule } from '@/lib/domain/rule-format';
import { buildRuleSet } from '@/rules';

export type DraftSource = { from: 'published' } | { from: 'baseline' } | { from: 'version'; ruleSetId: string };

/**
 * What a new draft starts from: a full copy of the jurisdiction's published version, the model
 * codes for its adopted editions (no amendments), or any published or retired version, also
 * another jurisdiction's. A copy from elsewhere takes this jurisdiction's editions; the draft
 * page then lists citations that name editions it did not adopt.
 */
export async function resolveDraftSource(
  db: DB,
  jurisdiction: Jurisdiction,
  source: DraftSource,
): Promise<{ parameters: RuleSetParameters; rules: StoredRule[]; basedOnId: string | null; label: string }> {
  if (source.from === 'baseline') {
    const built = buildRuleSet(jurisdiction.editions);
    return { parameters: built.parameters, rules: built.rules, basedOnId: null, label: `baseline for ${jurisdiction.editions.building}, ${jurisdiction.editions.electrical}, ${jurisdiction.editions.plumbing}` };
  }
  const copy = source.from === 'published' ? await findPublishedRuleSet(db, jurisdiction.id) : await findRuleSetById(db, source.ruleSetId);
  if (!copy) {
    if (source.from === 'published') throw new ConflictError(`${jurisdiction.name} has no published version to copy; start from the baseline instead.`);
    throw new ValidationError([{ path: 'ruleSetId', message: 'No such rule set version.' }]);
  }
  if (copy.status === 'draft') throw new ValidationError([{ path: 'ruleSetId', message: 'Copy a published or retired version, not another draft.' }]);
  const parameters = copy.jurisdictionId === jurisdiction.id ? copy.parameters : { ...copy.parameters, editions: { ...jurisdiction.editions } };
  return { parameters, rules: copy.rules, basedOnId: copy.id, label: `copy of ${copy.jurisdictionSlug} version ${copy.version}` };
}

/** A new jurisdiction and its first draft, in one transaction, both audited. */
export async function createJurisdictionWithDraft(
  db: DB,
  input: JurisdictionFields & { slug: string; startFrom: string; publishChangelog?: string },
  actorUserId: string,
  validate: (draft: RuleSetWithRules) => void | Record<string, unknown> = () => {},
): Promise<{ jurisdiction: Jurisdiction; draft: RuleSetVersion }> {
  let source: DraftSource = { from: 'baseline' };
  if (input.startFrom !== 'baseline') {
    const other = await findJurisdictionBySlug(db, input.startFrom);
    const published = other ? await findPublishedRuleSet(db, other.id) : null;
    if (!published) throw new ValidationError([{ path: 'startFrom', message: `'${input.startFrom}' has no published rule set to start from; choose another or the baseline.` }]);
    source = { from: 'version', ruleSetId: published.id };
  }
  return withConflicts(() =>
    db.transaction().execute(async (trx) => {
      const { startFrom: _s, publishChangelog, ...fields } = input;
      const jurisdiction = await insertJurisdiction(trx, fields);
      await writeAudit(trx, {
        actorUserId,
        action: 'jurisdiction.create',
        entityType: 'jurisdiction',
        entityId: jurisdiction.id,
        details: { jurisdictionId: jurisdiction.id, slug: jurisdiction.slug, editions: jurisdiction.editions, startFrom: input.startFrom },
      });
      const start = await resolveDraftSource(trx, jurisdiction, source);
      const draft = await insertDraft(trx, { jurisdictionId: jurisdiction.id, ...start, actorUserId, source: start.label });
      // Adopting the starting rules as they are: published in the same transaction, so the
      // jurisdiction never appears without a published version.
      if (publishChangelog) {
        await publishWithin(trx, { id: draft.id, revision: draft.revision, changelog: publishChangelog, actorUserId, validate });
        return { jurisdiction, draft: (await findRuleSetById(trx, draft.id))! };
      }
      return { jurisdiction, draft };
    }),
  );
}













/** A rule set version by id for the admin routes; a malformed id is a 404 like any unknown one. */
export async function requireRuleSet(db: DB, id: string): Promise<RuleSetWithRules> {
  const set = isUuid(id) ? await findRuleSetById(db, id) : null;
  if (!set) throw new NotFoundError('No such rule set version.');
  return set;
}

export async function requireJurisdiction(db: DB, slug: string): Promise<Jurisdiction> {
  const j = await findJurisdictionBySlug(db, slug);
  if (!j) throw new NotFoundError(`No jurisdiction '${slug}'.`);
  return j;
}
