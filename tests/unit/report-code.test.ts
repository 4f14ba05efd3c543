import { randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { newReportCode, normalizeReportCode, REPORT_CODE_BITS } from '@/lib/domain/reports/code';

const SYMBOL = '[2-9A-HJ-NP-Z]'; // 32 symbols: no 0, O, 1, I

describe('report codes', () => {
  it('carry at least 80 random bits in four groups of four symbols', () => {
    // 16 symbols from 32 = 16 × log2(32) = 80 bits.
    expect(REPORT_CODE_BITS).toBeGreaterThanOrEqual(80);
    const code = newReportCode(randomBytes);
    expect(code).toMatch(new RegExp(`^NP(-${SYMBOL}{4}){4}$`));
    expect(new Set(Array.from({ length: 200 }, () => newReportCode(randomBytes))).size).toBe(200);
  });

  it('use all five bits of each random byte, and only those', () => {
    expect(newReportCode((n) => Buffer.alloc(n, 0))).toBe('NP-2222-2222-2222-2222');
    expect(newReportCode((n) => Buffer.alloc(n, 31))).toBe('NP-ZZZZ-ZZZZ-ZZZZ-ZZZZ');
    expect(newReportCode((n) => Buffer.alloc(n, 31 + 32 * 7))).toBe('NP-ZZZZ-ZZZZ-ZZZZ-ZZZZ');
    expect(newReportCode((n) => Buffer.from(Array.from({ length: n }, (_, i) => i)))).toBe('NP-2345-6789-ABCD-EFGH');
  });

  it('are read back from what people type, and the 40-bit codes issued before still count', () => {
    expect(normalizeReportCode(' np-7k3q-m9td-x2wa-pp4r ')).toBe('NP-7K3Q-M9TD-X2WA-PP4R');
    expect(normalizeReportCode('NP 7K3Q M9TD X2WA PP4R')).toBe('NP-7K3Q-M9TD-X2WA-PP4R');
    expect(normalizeReportCode('np-7k3q-m9td')).toBe('NP-7K3Q-M9TD');
    for (const bad of ['NP-NONE-NONE', 'NP-7K3Q', 'NP-7K3Q-M9TD-X2WA', 'XX-7K3Q-M9TD', '', 'NP-7K3Q-M9TD%00', "NP-7K3Q-M9TD'--"]) {
      expect(normalizeReportCode(bad), bad).toBeNull();
    }
  });
});
