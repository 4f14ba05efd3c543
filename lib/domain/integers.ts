import { z } from 'zod';

/** PostgreSQL `integer` is a signed 32-bit number: no revision, version or count column holds more. */
export const PG_INTEGER_MAX = 2_147_483_647;

/**
 * A whole number from 1 to the largest PostgreSQL `integer`, read from a URL segment or query value;
 * null for anything else ("2147483648", "1e3", "-1", " 7", ""), so callers answer 404 or 400, never 500.
 */
export function parsePositiveInt(text: string | null | undefined): number | null {
  if (typeof text !== 'string' || !/^[0-9]{1,10}$/.test(text)) return null;
  const n = Number(text);
  return n >= 1 && n <= PG_INTEGER_MAX ? n : null;
}

/** The zod form of the same bound, for bodies and query strings. */
export function positiveIntSchema(what: string) {
  return z
    .number({ error: `${what} must be a whole number.` })
    .int(`${what} must be a whole number.`)
    .min(1, `${what} starts at 1.`)
    .max(PG_INTEGER_MAX, `${what} cannot be over ${PG_INTEGER_MAX.toLocaleString('en-US')}.`);
}
