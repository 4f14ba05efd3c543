import { parseEdition, type Editions, type EditionSlot } from '@/lib/domain/editions';
import type { StoredRule } from '@/lib/domain/rule-format';

export type CitationMismatch = { ruleKey: string; cited: string; adopted: string };

// Which adopted edition a code's sections belong to (IRC plumbing chapters follow the building edition).
const SLOTS_BY_CODE: Record<string, EditionSlot[]> = {
  IRC: ['building', 'plumbing'],
  IBC: ['building'],
  NEC: ['electrical'],
  IPC: ['plumbing'],
  UPC: ['plumbing'],
  IMC: ['mechanical'],
  UMC: ['mechanical'],
  IFGC: ['fuelGas'],
};

/**
 * Rules citing a code edition the jurisdiction did not adopt: after a copy from a jurisdiction
 * with other editions, or after the jurisdiction's editions changed. Local amendments,
 * manufacturer's instructions and common practice carry no edition and are skipped.
 */
export function citationMismatches(rules: StoredRule[], editions: Editions): CitationMismatch[] {
  const adopted = (Object.keys(SLOTS_BY_CODE) as string[]).reduce<Record<string, string[]>>((acc, code) => {
    acc[code] = SLOTS_BY_CODE[code]
      .map((slot) => parseEdition(editions[slot]))
      .filter((e): e is NonNullable<typeof e> => !!e && e.code === code)
      .map((e) => String(e.year));
    return acc;
  }, {});
  const out: CitationMismatch[] = [];
  for (const rule of rules) {
    const { code, edition } = rule.citation;
    if (!edition || !(code in SLOTS_BY_CODE)) continue;
    const years = adopted[code];
    if (!years.includes(edition)) {
      out.push({
        ruleKey: rule.key,
        cited: `${code} ${edition}`,
        adopted: years.length ? years.map((y) => `${code} ${y}`).join(', ') : `no edition of ${code}`,
      });
    }
  }
  return out;
}
