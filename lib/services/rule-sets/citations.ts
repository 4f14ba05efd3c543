import 'server-only';
import type { DB } from '@/db';
import { latestCitationMarks, recordCitationMark } from '@/db/citation-checks';
import { publishDraft, type RuleSetWithRules } from '@/db/rule-sets';
import { ConfirmationRequiredError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';
import { forgetCachedCopies } from '@/lib/platform/cache/invalidation';
import { assertPublishable } from '@/lib/domain/rule-sets/publish-check';
import { citationStatuses, uncheckedMemoryCitations, type CitationCheckInput, type CitationMark, type CitationStatus } from '@/lib/domain/rule-sets/citation-checks';

/** Every citation of a version with the jurisdiction's check status, and the from-memory ones still unchecked. */
export async function listCitationStatuses(db: DB, set: RuleSetWithRules): Promise<{ citations: CitationStatus[]; uncheckedMemory: ReturnType<typeof uncheckedMemoryCitations> }> {
  const marks = await latestCitationMarks(db, set.id);
  return { citations: citationStatuses(set.rules, marks), uncheckedMemory: uncheckedMemoryCitations(set.rules, marks) };
}

/** An admin marks one citation of a draft as checked against the adopted text, or withdraws the mark. */
export async function markCitation(db: DB, actor: AppUser, set: RuleSetWithRules, input: CitationCheckInput): Promise<CitationMark> {
  return recordCitationMark(db, {
    ruleSetId: set.id,
    ruleKey: input.ruleKey,
    checked: input.checked,
    against: input.checked ? (input.against ?? null) : null,
    actor: { id: actor.id, name: actor.name, email: actor.email },
  });
}

/**
 * The from-memory citations of a draft nobody checked; refused with a 409 naming `confirm` that lists
 * them unless the admin confirmed. Returns the list the confirmation covered, for the audit.
 */
export function assertUncheckedConfirmed(draft: Pick<RuleSetWithRules, 'rules'>, marks: Map<string, CitationMark>, confirm: boolean | undefined) {
  const unchecked = uncheckedMemoryCitations(draft.rules, marks);
  if (unchecked.length && confirm !== true) {
    throw new ConfirmationRequiredError(
      'confirm',
      `${unchecked.length} citation${unchecked.length === 1 ? ' is' : 's are'} from memory and not yet checked against the adopted text: ` +
        `${unchecked.map((u) => `${u.ruleKey} (${u.citation})`).join('; ')}. ` +
        'Check them first, or send the same request with confirm: true to publish with them unchecked; reports will say they are not yet checked by the jurisdiction.',
    );
  }
  return unchecked;
}

/**
 * Publishes a draft. From-memory citations nobody checked against the adopted text need the admin's
 * explicit confirmation (`confirm: true`); the publish audit entry records the list it covered.
 */
export async function publishRuleSet(db: DB, actor: AppUser, set: RuleSetWithRules, input: { revision: number; changelog: string; confirm?: boolean }) {
  const marks = await latestCitationMarks(db, set.id);
  const result = await publishDraft(db, {
    id: set.id,
    revision: input.revision,
    changelog: input.changelog,
    actorUserId: actor.id,
    validate: (draft) => {
      assertPublishable(draft, 'This draft cannot be published yet.');
      const unchecked = assertUncheckedConfirmed(draft, marks, input.confirm);
      return unchecked.length ? { uncheckedConfirmed: unchecked } : {};
    },
  });
  // The next evaluation on this server uses the new version at once.
  forgetCachedCopies();
  return result;
}
