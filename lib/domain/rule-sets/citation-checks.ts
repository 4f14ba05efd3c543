import { z } from 'zod';
import type { Citation, Confidence } from '@/lib/domain/rule-format';
import { citationText } from '@/lib/domain/vocabulary';

/** The latest mark on one rule's citation in one version. */
export type CitationMark = {
  ruleKey: string;
  /** The citation as it read when marked. */
  citation: string;
  checked: boolean;
  against: string | null;
  checkedBy: string;
  checkedAt: Date;
  /** Set when the mark was carried from the version this draft was copied from. */
  carriedFromVersion: number | null;
};

/** One citation of a version with its check status, as the admin screens and the publish step see it. */
export type CitationStatus = {
  ruleKey: string;
  title: string;
  enabled: boolean;
  citation: string;
  confidence: Confidence;
  checkable: boolean;
  mark: CitationMark | null;
};

const NOT_CODE = new Set(["manufacturer's instructions", 'common practice']);

/** A citation a jurisdiction can check against its adopted text: a code or local amendment section, not the maker's instructions or common practice. */
export function isCheckableCitation(citation: Citation): boolean {
  return !NOT_CODE.has(citation.code);
}

/** A mark counts only while it is a check (not withdrawn) of the citation as the rule now reads. */
export function markHolds(mark: Pick<CitationMark, 'checked' | 'citation'> | null | undefined, citation: Citation): boolean {
  return !!mark && mark.checked && mark.citation === citationText(citation);
}

export function citationStatuses(
  rules: { key: string; title: string; enabled: boolean; citation: Citation; confidence: Confidence }[],
  marks: Map<string, CitationMark>,
): CitationStatus[] {
  return rules.map((r) => ({
    ruleKey: r.key,
    title: r.title,
    enabled: r.enabled,
    citation: citationText(r.citation),
    confidence: r.confidence,
    checkable: isCheckableCitation(r.citation),
    mark: marks.get(r.key) ?? null,
  }));
}

/**
 * Enabled rules whose citation is from memory (M) and not checked against the adopted text: publishing
 * them needs the admin's confirmation.
 */
export function uncheckedMemoryCitations(
  rules: { key: string; title: string; enabled: boolean; citation: Citation; confidence: Confidence }[],
  marks: Map<string, Pick<CitationMark, 'checked' | 'citation'>>,
): { ruleKey: string; title: string; citation: string }[] {
  return rules
    .filter((r) => r.enabled && r.confidence === 'M' && isCheckableCitation(r.citation) && !markHolds(marks.get(r.key), r.citation))
    .map((r) => ({ ruleKey: r.key, title: r.title, citation: citationText(r.citation) }));
}

/**
 * A finding's citation status in the inspector's terms, for reports (PDF and web). The source
 * confidence letters are for admins; the inspector reads whether the jurisdiction checked the
 * citation against its adopted code.
 */
export function citationStatusText(
  citation: Citation,
  checkedOn: Date | string | null,
  /** The day in the jurisdiction's zone: `(at) => formatDate(at, timeZone)` from lib/domain/dates/format. */
  formatDay: (at: Date | string) => string,
): string {
  if (citation.code === 'common practice') return 'common practice, not a code section';
  if (citation.code === "manufacturer's instructions") return "the appliance maker's installation instructions";
  return checkedOn ? `checked against the adopted code by the jurisdiction on ${formatDay(checkedOn)}` : 'not yet checked by the jurisdiction';
}

/** What an admin sends to mark one citation checked, or to withdraw the mark. */
export const citationCheckSchema = z
  .object({
    ruleKey: z.string().trim().min(1, 'Name the rule whose citation you checked.').max(120),
    checked: z.boolean({ error: 'Say whether the citation is checked (true) or the mark is withdrawn (false).' }),
    against: z
      .string()
      .trim()
      .max(300, 'Keep it under 300 characters.')
      .optional()
      .describe('What the citation was checked against, e.g. "2021 IRC as adopted by ordinance 12-34".'),
  })
  .strict()
  .refine((v) => !v.checked || (v.against ?? '').length > 0, {
    path: ['against'],
    message: 'Say what you checked the citation against, e.g. "2021 IRC as adopted by ordinance 12-34".',
  });

export type CitationCheckInput = z.infer<typeof citationCheckSchema>;

/** The date a finding's citation was checked, when the mark is of the citation the finding cites. */
export function checkedOnFor(
  finding: { ruleKey: string; citation: Citation },
  checks: Record<string, { citation: string; checkedOn: string }> | undefined,
): string | null {
  const mark = checks?.[finding.ruleKey];
  return mark && mark.citation === citationText(finding.citation) ? mark.checkedOn : null;
}

/** A finding's local amendments as the report prints them, each beside the model section it changes. */
export function amendmentCitationText(
  finding: { citation: Citation; amendments?: { citation: string }[] },
): string | null {
  const cited = (finding.amendments ?? []).map((a) => a.citation);
  if (cited.length === 0) return null;
  return `${[...new Set(cited)].join('; ')}, amending ${citationText(finding.citation)}`;
}
