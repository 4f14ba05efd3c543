import type { DB } from '@/db/index';
import { writeAudit } from '@/db/audit';
import { ConflictError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import type { StoredRule } from '@/lib/domain/rule-format';
import { isCheckableCitation, type CitationMark } from '@/lib/domain/rule-sets/citation-checks';
import { citationText } from '@/lib/domain/vocabulary';

/**
 * The latest mark per rule of one version. A carried mark reads as the original check: who checked,
 * when, and against what, plus the version it was checked in.
 */
export async function latestCitationMarks(db: DB, ruleSetId: string): Promise<Map<string, CitationMark>> {
  const rows = await db
    .selectFrom('citation_checks as c')
    .leftJoin('citation_checks as o', 'o.id', 'c.carried_from_id')
    .leftJoin('rule_sets as os', 'os.id', 'o.rule_set_id')
    .select([
      'c.rule_key', 'c.citation', 'c.checked', 'c.checked_against', 'c.checked_by_name', 'c.checked_at',
      'o.checked_by_name as original_by', 'o.checked_at as original_at', 'os.version as original_version',
    ])
    .distinctOn('c.rule_key')
    .where('c.rule_set_id', '=', ruleSetId)
    .orderBy('c.rule_key')
    .orderBy('c.id', 'desc')
    .execute();
  return new Map(
    rows.map((r) => [
      r.rule_key,
      {
        ruleKey: r.rule_key,
        citation: r.citation,
        checked: r.checked,
        against: r.checked_against,
        checkedBy: r.original_by ?? r.checked_by_name,
        checkedAt: r.original_at ?? r.checked_at,
        carriedFromVersion: r.original_version ?? null,
      },
    ]),
  );
}

/**
 * Appends a mark (or its withdrawal) on one rule's citation of a draft, with its audit entry. The
 * database refuses marks on published or retired versions as well.
 */
export async function recordCitationMark(
  db: DB,
  input: { ruleSetId: string; ruleKey: string; checked: boolean; against: string | null; actor: { id: string; name: string; email: string } },
): Promise<CitationMark> {
  await db.transaction().execute(async (trx) => {
    // Locks the version so a publish cannot slip between the status check and the insert.
    const set = await trx.selectFrom('rule_sets').select(['id', 'status', 'version', 'jurisdiction_id']).where('id', '=', input.ruleSetId).forUpdate().executeTakeFirst();
    if (!set) throw new NotFoundError('No such rule set version.');
    if (set.status !== 'draft') throw new ConflictError(`Version ${set.version} is ${set.status}; citations are marked on a draft. Start a new draft to check them.`);
    const rule = await trx.selectFrom('rules').select(['key', 'definition']).where('rule_set_id', '=', set.id).where('key', '=', input.ruleKey).executeTakeFirst();
    if (!rule) throw new ValidationError([{ path: 'ruleKey', message: `This draft has no rule '${input.ruleKey}'.` }]);
    const citation = (rule.definition as Pick<StoredRule, 'citation'>).citation;
    if (!isCheckableCitation(citation)) {
      throw new ValidationError([{ path: 'ruleKey', message: `${input.ruleKey} cites ${citationText(citation)}, not a code section; there is no adopted text to check it against.` }]);
    }
    const inserted = await trx
      .insertInto('citation_checks')
      .values({
        jurisdiction_id: set.jurisdiction_id,
        rule_set_id: set.id,
        rule_key: input.ruleKey,
        citation: citationText(citation),
        checked: input.checked,
        checked_against: input.checked ? input.against : null,
        checked_by: input.actor.id,
        checked_by_name: input.actor.name || input.actor.email,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    await writeAudit(trx, {
      actorUserId: input.actor.id,
      action: input.checked ? 'rule-set.citation.check' : 'rule-set.citation.withdraw',
      entityType: 'rule_set',
      entityId: set.id,
      details: { jurisdictionId: set.jurisdiction_id, version: set.version, ruleKey: input.ruleKey, citation: citationText(citation), against: input.against, markId: inserted.id },
    });
  });
  return (await latestCitationMarks(db, input.ruleSetId)).get(input.ruleKey)!;
}

/**
 * A new draft copied from a version of the same jurisdiction keeps the checks of citations that did
 * not change: each becomes a new row of the draft pointing at the original check.
 */
export async function carryCitationMarks(trx: DB, input: { fromRuleSetId: string; toRuleSetId: string; jurisdictionId: string; rules: StoredRule[] }): Promise<number> {
  const marks = await latestCitationMarks(trx, input.fromRuleSetId);
  const originals = await trx
    .selectFrom('citation_checks')
    .select(['id', 'rule_key', 'carried_from_id', 'checked_against', 'checked_by', 'checked_by_name'])
    .distinctOn('rule_key')
    .where('rule_set_id', '=', input.fromRuleSetId)
    .orderBy('rule_key')
    .orderBy('id', 'desc')
    .execute();
  const source = await trx.selectFrom('rule_sets').select('jurisdiction_id').where('id', '=', input.fromRuleSetId).executeTakeFirst();
  if (source?.jurisdiction_id !== input.jurisdictionId) return 0;
  const rows = originals.flatMap((o) => {
    const mark = marks.get(o.rule_key);
    const rule = input.rules.find((r) => r.key === o.rule_key);
    if (!mark?.checked || !rule || mark.citation !== citationText(rule.citation)) return [];
    return [{
      jurisdiction_id: input.jurisdictionId,
      rule_set_id: input.toRuleSetId,
      rule_key: o.rule_key,
      citation: mark.citation,
      checked: true,
      checked_against: o.checked_against,
      checked_by: o.checked_by,
      checked_by_name: o.checked_by_name,
      carried_from_id: o.carried_from_id ?? o.id,
    }];
  });
  if (rows.length) await trx.insertInto('citation_checks').values(rows).execute();
  return rows.length;
}

/** Checked-on dates per rule key of one version, for reports: only marks that still match the citation. */
export async function citationCheckedDates(db: DB, ruleSetId: string): Promise<Record<string, { citation: string; checkedOn: string }>> {
  const marks = await latestCitationMarks(db, ruleSetId);
  const out: Record<string, { citation: string; checkedOn: string }> = {};
  for (const [key, m] of marks) if (m.checked) out[key] = { citation: m.citation, checkedOn: new Date(m.checkedAt).toISOString() };
  return out;
}
