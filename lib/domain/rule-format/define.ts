import type { TopLevelCondition } from 'json-rules-engine';
import { parseEdition, type EditionSlot } from '@/lib/domain/editions';
import type { FactKind } from '@/lib/domain/facts';
import { readParam, type RuleSetParameters } from '@/lib/domain/params';
import type { LengthStyle } from '@/lib/domain/units';

export { areas, type Area } from '@/lib/domain/vocabulary';
import type { Area } from '@/lib/domain/vocabulary';

/** V verified, S secondary sources only, M from memory, CP common practice (see TRADE.md). */
export type Confidence = 'V' | 'S' | 'M' | 'CP';
export type Severity = 'fail' | 'caution';

/** A value a condition or a limit compares with: a literal, a fact, or a rule-set parameter. */
export type ValueRef = number | boolean | string | null | { fact: string; path?: string };
export type Limit = ValueRef | { min: ValueRef; max: ValueRef };

export interface Citation {
  code: string;
  edition: string | null;
  section: string | null;
}

/** One section number of a baseline rule, valid for the listed editions of one code. */
export interface CitationEntry {
  source: EditionSlot | 'manufacturer' | 'common-practice' | 'local';
  /** Code the section belongs to (IRC, IMC, NEC, IPC, UPC, IFGC); for code sources only. */
  code?: string;
  /** Edition years this section number applies to; omitted = every edition. */
  years?: number[];
  section?: string;
  /** For local amendments: the parameter holding the amendment's section. */
  sectionParam?: string;
  confidence: Confidence;
}

export interface Messages {
  pass: string;
  fail: string;
  notApplicable: string;
}

/**
 * A citation and wording that replace the rule's own for a plan where a text fact has the given value
 * (the developed length checked against the dryer maker's maximum cites the maker's-length clause).
 */
export interface CitationVariant {
  when: { fact: string; equals: string | boolean };
  /** Omitted: the rule's own citation stands and only the wording changes. */
  citations?: CitationEntry[];
  messages?: Partial<Messages>;
}

export interface StoredCitationVariant {
  when: { fact: string; equals: string | boolean };
  citation: Citation;
  confidence: Confidence;
  citationNote: string | null;
  messages?: Partial<Messages>;
}

/** A baseline rule: its conditions plus the citation for each edition it knows. */
export interface RuleDefinition {
  key: string;
  title: string;
  area: Area;
  severity: Severity;
  citations: CitationEntry[];
  /** When false the rule is not-applicable; decided after its facts are known. */
  applicability: TopLevelCondition | null;
  /** The passing state; when false the finding takes the rule's severity. */
  conditions: TopLevelCondition;
  /** Facts the conditions need; a null one makes the finding needs-info. */
  requires: string[];
  measured: string | null;
  limit: Limit | null;
  unit: FactKind;
  lengthStyle?: LengthStyle;
  messages: Messages;
  remedy: string | null;
  variants?: CitationVariant[];
}

/** The rule as a published rule set version stores it, citation resolved to the adopted edition. */
export interface StoredRule extends Omit<RuleDefinition, 'citations' | 'variants'> {
  enabled: boolean;
  citation: Citation;
  confidence: Confidence;
  /** Set when the section number could not be matched to the adopted edition exactly. */
  citationNote: string | null;
  /** Citations resolved per plan: the first whose fact has the value replaces the rule's own. */
  variants?: StoredCitationVariant[];
}

export const param = (path: string) => ({ fact: 'params', path: `$.${path}` });

export function cond(name: string, fact: string, operator: string, value: ValueRef) {
  return { name, fact, operator, value };
}

export function paramCond(name: string, path: string, operator: string, value: ValueRef) {
  return { name, fact: 'params', path: `$.${path}`, operator, value };
}

export const all = (name: string, ...conditions: unknown[]) => ({ name, all: conditions }) as unknown as TopLevelCondition;
export const any = (name: string, ...conditions: unknown[]) => ({ name, any: conditions }) as unknown as TopLevelCondition;

export const manufacturer = (confidence: Confidence = 'S'): CitationEntry => ({ source: 'manufacturer', confidence });
export const commonPractice = (): CitationEntry => ({ source: 'common-practice', confidence: 'CP' });

const SOURCE_NAMES: Record<'manufacturer' | 'common-practice', string> = {
  manufacturer: "manufacturer's instructions",
  'common-practice': 'common practice',
};

/**
 * Picks the section number for the jurisdiction's adopted edition. An exact match keeps the
 * entry's confidence; otherwise the nearest edition's number is used, marked M with a note.
 */
export function resolveCitation(
  entries: CitationEntry[],
  params: RuleSetParameters,
): { citation: Citation; confidence: Confidence; citationNote: string | null } {
  const first = entries[0];
  if (first.source === 'manufacturer' || first.source === 'common-practice') {
    return { citation: { code: SOURCE_NAMES[first.source], edition: null, section: null }, confidence: first.confidence, citationNote: null };
  }
  if (first.source === 'local') {
    const section = first.sectionParam ? readParam(params, first.sectionParam) : null;
    return {
      citation: { code: 'local amendment', edition: params.editions.plumbing, section: typeof section === 'string' ? section : null },
      confidence: first.confidence,
      citationNote: typeof section === 'string' ? null : 'Enter the local amendment’s section in the rule set parameters.',
    };
  }
  const slot = first.source;
  const adoptedText = params.editions[slot];
  const adopted = parseEdition(adoptedText);
  const sameCode = entries.filter((e) => e.source === slot && e.code === adopted?.code);
  if (adopted && sameCode.length > 0) {
    const exact = sameCode.find((e) => e.years === undefined || e.years.includes(adopted.year));
    if (exact) {
      return {
        citation: { code: adopted.code, edition: String(adopted.year), section: exact.section ?? null },
        confidence: exact.confidence,
        citationNote: null,
      };
    }
    const distance = (e: CitationEntry) => Math.min(...(e.years ?? [adopted.year]).map((y) => Math.abs(y - adopted.year)));
    const nearest = [...sameCode].sort((a, b) => distance(a) - distance(b))[0];
    const from = nearest.years ? ` ${Math.max(...nearest.years)}` : '';
    return {
      citation: { code: adopted.code, edition: String(adopted.year), section: nearest.section ?? null },
      confidence: 'M',
      citationNote: `Section number taken from ${adopted.code}${from}; confirm it in the adopted ${adoptedText}.`,
    };
  }
  const fallback = entries.find((e) => e.source === slot) ?? first;
  const year = fallback.years ? Math.max(...fallback.years) : null;
  return {
    citation: { code: fallback.code ?? slot, edition: year === null ? null : String(year), section: fallback.section ?? null },
    confidence: 'M',
    citationNote: `The jurisdiction adopted ${adoptedText}; this cites ${fallback.code}${year ? ` ${year}` : ''}. Confirm the equivalent section.`,
  };
}
