import { describe, expect, it } from 'vitest';
import { findLoneSurrogate } from '@/lib/platform/http';
import { parsePositiveInt, PG_INTEGER_MAX, positiveIntSchema } from '@/lib/domain/integers';

describe('parsePositiveInt', () => {
  it('takes whole numbers from 1 to the largest PostgreSQL integer', () => {
    // PostgreSQL 15 manual, 8.1.1 Integer Types: integer is -2147483648 to +2147483647.
    expect(PG_INTEGER_MAX).toBe(2 ** 31 - 1);
    expect(parsePositiveInt('1')).toBe(1);
    expect(parsePositiveInt('2147483647')).toBe(2147483647);
  });

  it('refuses everything else, so no query ever reaches the database with it', () => {
    for (const text of ['2147483648', '99999999999', '0', '-1', '1e3', '1.5', ' 7', '7 ', '0x10', '', 'NaN', 'Infinity', undefined, null]) {
      expect(parsePositiveInt(text as string), String(text)).toBeNull();
    }
  });

  it('has a zod form with the same bound and a message that names the limit', () => {
    const schema = positiveIntSchema('The revision');
    expect(schema.safeParse(2147483647).success).toBe(true);
    const over = schema.safeParse(2147483648);
    expect(over.success).toBe(false);
    expect(over.error?.issues[0].message).toContain('2,147,483,647');
    expect(schema.safeParse(0).success).toBe(false);
    expect(schema.safeParse(1.5).success).toBe(false);
  });
});

describe('findLoneSurrogate', () => {
  it('finds half a surrogate pair in a value or a key and gives its path', () => {
    // Unicode 15, 3.9 D91: a code unit sequence with an unpaired surrogate is ill-formed UTF-16.
    expect(findLoneSurrogate({ name: 'a\ud800' })).toBe('name');
    expect(findLoneSurrogate({ plan: { doors: [{ x: 1 }, { label: '\udc00b' }] } })).toBe('plan.doors.1.label');
    expect(findLoneSurrogate({ ['k\ud83d']: 1 })).toBe('k\ud83d');
    expect(findLoneSurrogate('\ud800')).toBe('');
  });

  it('passes whole pairs, plain text and non-strings', () => {
    expect(findLoneSurrogate({ name: 'фото-😀', n: 2, ok: true, none: null, list: ['a', 'ü'] })).toBeNull();
    expect(findLoneSurrogate('\ud83d\ude00')).toBeNull();
  });
});
