import type { TopLevelCondition } from 'json-rules-engine';
import { parseEdition, type EditionSlot } from '@/lib/domain/editions';
import type { FactKind } from '@/lib/domain/facts';
import { readParam, type RuleSetParameters } from '@/lib/domain/params';
import type { LengthStyle } from '@/lib/domain/units';
import { citationText } from '@/lib/domain/vocabulary';

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
  source: EditionSlot | 'manufacturer' | 'common-practice' | 'physical' | 'local';
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
 * A citation a finding shows instead of the rule's own when the plan's facts match `when`: a dwelling in an
 * IRC jurisdiction cites the IRC's section rather than the IFGC's or the IMC's.
 */
export interface CitationVariantDefinition {
  /** Fact values (boolean or text) that must all hold for this citation to be the one shown. */
  when: Readonly<Record<string, boolean | string>>;
  /** Only where the jurisdiction adopted this code in this slot (the IRC as its building code). */
  adopted?: { slot: EditionSlot; code: string };
  citations: CitationEntry[];
  /** Added to the citation note; `{citation}` reads as the resolved citation ("IMC 2018 504.6"). */
  note?: string;
  /** Wording used instead of the rule's own for these plans (the maker's length, a ventless dryer). */
  messages?: Partial<Messages>;
}

/** A resolved citation as a finding shows it. */
export interface ResolvedCitation {
  citation: Citation;
  confidence: Confidence;
  citationNote: string | null;
}

/** A resolved citation variant as a published rule stores it (see `CitationVariantDefinition`). */
export interface StoredCitationVariant extends ResolvedCitation {
  when: Record<string, boolean | string>;
  messages?: Partial<Messages>;
}

/** A baseline rule: its conditions plus the citation for each edition it knows. */
export interface RuleDefinition {
  key: string;
  title: string;
  area: Area;
  severity: Severity;
  citations: CitationEntry[];
  /** Added to the rule's own citation note; `{citation}` reads as the resolved citation. */
  citationNoteText?: string;
  /** Citations for particular plans (by building type, by fuel), first match wins; else `citations`. */
  citationVariants?: CitationVariantDefinition[];
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
}

/** The rule as a published rule set version stores it, citation resolved to the adopted edition. */
export interface StoredRule extends Omit<RuleDefinition, 'citations' | 'citationVariants' | 'citationNoteText'> {
  enabled: boolean;
  citation: Citation;
  confidence: Confidence;
  /** Set when the section number could not be matched to the adopted edition exactly. */
  citationNote: string | null;
  /**
   * Citations for particular plans. They hold only while `citation` is still `base`: a rule re-cited by an
   * admin (a local amendment) shows the admin's citation for every plan.
   */
  citationVariants?: { base: Citation; variants: StoredCitationVariant[] };
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

const SOURCE_NAMES: Record<'manufacturer' | 'common-practice' | 'physical', string> = {
  manufacturer: "manufacturer's instructions",
  'common-practice': 'common practice',
  physical: "physical fit (the plan's own sizes)",
};

/** What the admin must do when a local amendment's section is not recorded: for rule-set screens only. */
export const LOCAL_SECTION_ADMIN_NOTE = 'Enter the local amendment’s section in the rule set parameters.';
/** The same gap as an installer reads it: what to do about it on the job. */
const LOCAL_SECTION_INSTALLER_NOTE = 'The local amendment’s section number is not on record here; the AHJ can say which section applies.';

/*
 * Sentences in a citation note that tell an admin what to fix in the rule set. Published rules store them in
 * `citationNote` (rules carry no version), so findings split them out: the installer reads what to do instead.
 */
const ADMIN_SENTENCES: ReadonlyArray<{ admin: string; installer: string }> = [
  { admin: LOCAL_SECTION_ADMIN_NOTE, installer: LOCAL_SECTION_INSTALLER_NOTE },
];

/** A citation note split into what the installer reads and what only admins see (null when there is none). */
export function splitCitationNote(note: string | null): { installer: string | null; admin: string | null } {
  if (!note) return { installer: note, admin: null };
  let installer = note;
  const admin: string[] = [];
  for (const sentence of ADMIN_SENTENCES) {
    if (!installer.includes(sentence.admin)) continue;
    installer = installer.replace(sentence.admin, sentence.installer);
    admin.push(sentence.admin);
  }
  return { installer, admin: admin.length > 0 ? admin.join(' ') : null };
}

/** The admin-only notes of a rule set's enabled rules (their own citation and each variant's), one per rule. */
export function adminNotesFor(rules: ReadonlyArray<Pick<StoredRule, 'key' | 'title' | 'enabled' | 'citationNote' | 'citationVariants'>>): Array<{ ruleKey: string; title: string; note: string }> {
  return rules.flatMap((rule) => {
    if (!rule.enabled) return [];
    const notes = [rule.citationNote, ...(rule.citationVariants?.variants ?? []).map((v) => v.citationNote)].map((n) => splitCitationNote(n).admin);
    const note = [...new Set(notes.filter((n): n is string => n !== null))].join(' ');
    return note ? [{ ruleKey: rule.key, title: rule.title, note }] : [];
  });
}

/**
 * Picks the section number for the jurisdiction's adopted edition. An exact match keeps the
 * entry's confidence; otherwise the nearest edition's number is used, marked M with a note.
 */
export function resolveCitation(
  entries: CitationEntry[],
  params: RuleSetParameters,
): { citation: Citation; confidence: Confidence; citationNote: string | null } {
  const first = entries[0];
  if (first.source === 'manufacturer' || first.source === 'common-practice' || first.source === 'physical') {
    return { citation: { code: SOURCE_NAMES[first.source], edition: null, section: null }, confidence: first.confidence, citationNote: null };
  }
  if (first.source === 'local') {
    const section = first.sectionParam ? readParam(params, first.sectionParam) : null;
    return {
      citation: { code: 'local amendment', edition: params.editions.plumbing, section: typeof section === 'string' ? section : null },
      confidence: first.confidence,
      citationNote: typeof section === 'string' ? null : LOCAL_SECTION_ADMIN_NOTE,
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

const withNote = (resolved: ResolvedCitation, note: string | undefined): ResolvedCitation => {
  if (!note) return resolved;
  const text = note.replace(/\{citation\}/g, citationText(resolved.citation));
  return { ...resolved, citationNote: resolved.citationNote ? `${resolved.citationNote} ${text}` : text };
};

/** A rule's own citation and its variants for the plans they suit, resolved to the adopted editions. */
export function resolveRuleCitations(
  definition: Pick<RuleDefinition, 'citations' | 'citationNoteText' | 'citationVariants'>,
  params: RuleSetParameters,
): ResolvedCitation & { citationVariants?: StoredRule['citationVariants'] } {
  const own = withNote(resolveCitation(definition.citations, params), definition.citationNoteText);
  const variants = (definition.citationVariants ?? [])
    .filter((v) => !v.adopted || parseEdition(params.editions[v.adopted.slot])?.code === v.adopted.code)
    .map((v): StoredCitationVariant => ({
      when: { ...v.when },
      ...withNote(resolveCitation(v.citations, params), v.note),
      ...(v.messages ? { messages: { ...v.messages } } : {}),
    }));
  return variants.length > 0 ? { ...own, citationVariants: { base: own.citation, variants } } : own;
}

const sameCitation = (a: Citation, b: Citation) => a.code === b.code && a.edition === b.edition && a.section === b.section;

/** The variant that suits this plan: the first whose facts all match, while the rule keeps its baseline citation. */
export function variantForFacts(rule: StoredRule, facts: Readonly<Record<string, unknown>>): StoredCitationVariant | null {
  const variants = rule.citationVariants;
  if (!variants || !sameCitation(variants.base, rule.citation)) return null;
  return variants.variants.find((v) => Object.entries(v.when).every(([fact, value]) => facts[fact] === value)) ?? null;
}

/** The citation a finding for this plan shows: the first variant whose facts all match, else the rule's own. */
export function citationForFacts(rule: StoredRule, facts: Readonly<Record<string, unknown>>): ResolvedCitation {
  const match = variantForFacts(rule, facts);
  return match
    ? { citation: match.citation, confidence: match.confidence, citationNote: match.citationNote }
    : { citation: rule.citation, confidence: rule.confidence, citationNote: rule.citationNote };
}
