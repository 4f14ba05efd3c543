// Report codes are printed on paper, read over the phone and typed by inspectors: 32 symbols without
// 0/O and 1/I, in groups of four. Pure, so the unit tests and the browser can use it.
const ALPHABET = '23456789ABCDEFGHJKLMNPQRSTUVWXYZ';
const SYMBOL = `[${ALPHABET}]`;

/** NP-XXXX-XXXX-XXXX-XXXX: 16 symbols of 5 bits, 80 random bits. */
const CURRENT = new RegExp(`^NP(-${SYMBOL}{4}){4}$`);
/** NP-XXXX-XXXX: the 40-bit codes issued before; those reports still verify. */
const LEGACY = new RegExp(`^NP(-${SYMBOL}{4}){2}$`);

export const REPORT_CODE_BITS = 80;

/** A new code from `random` (crypto.randomBytes): each byte's low 5 bits pick a symbol, so every symbol is equally likely. */
export function newReportCode(random: (n: number) => Buffer): string {
  const symbols = REPORT_CODE_BITS / 5;
  const bytes = random(symbols);
  let out = '';
  for (let i = 0; i < symbols; i++) out += ALPHABET[bytes[i] & 31];
  return `NP-${out.match(/.{4}/g)!.join('-')}`;
}

/**
 * The code as stored, from what someone typed or pasted (lower case, spaces for dashes, stray blanks),
 * or null when it cannot be a code NookPass issued: such input needs no database lookup.
 */
export function normalizeReportCode(input: string): string | null {
  const code = input.trim().toUpperCase().replace(/[\s_\u2010-\u2015]+/g, '-');
  return CURRENT.test(code) || LEGACY.test(code) ? code : null;
}
