import { describe, expect, it } from 'vitest';
import {
  cm2ToSqIn,
  convertLength,
  formatArea,
  formatLength,
  inchesToMm,
  mmToInches,
  parseArea,
  parseLength,
  sqInToCm2,
} from '@/lib/domain/units';

// Tolerance for comparisons with the exact NIST SP 811 factors: 1e-9 relative. convert-units 2.3.4
// alone is off by about 3e-8 (lengths) and 1e-6 (areas), so these checks fail without our anchor fix.
const REL = 1e-9;
const close = (actual: number, expected: number) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * REL + 1e-12);

const ok = (r: ReturnType<typeof parseLength>) => {
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
};

describe('conversions against NIST SP 811 exact factors', () => {
  it('1 in = 25.4 mm exactly', () => {
    close(inchesToMm(1), 25.4); // NIST SP 811 Appendix B: inch = 2.54 E-02 m (exact)
    close(inchesToMm(30), 762); // convert-units alone gives 761.99997
    close(mmToInches(762), 30);
    close(mmToInches(10668), 420); // 35 ft, the IRC developed-length limit, entered in mm
  });
  it('1 ft = 0.3048 m exactly', () => {
    close(convertLength(1, 'ft', 'm'), 0.3048); // NIST SP 811 Appendix B: foot = 3.048 E-01 m (exact)
    close(convertLength(0.3048, 'm', 'in'), 12);
  });
  it('1 sq in = 6.4516 cm² exactly', () => {
    close(sqInToCm2(1), 6.4516); // NIST SP 811 Appendix B: square inch = 6.4516 E-04 m² (exact)
    close(cm2ToSqIn(387), 387 / 6.4516);
    expect(sqInToCm2(100)).toBe(645.16);
    expect(cm2ToSqIn(645.16)).toBe(100);
  });
});

describe('parseLength', () => {
  const cases: Array<[string | number, 'imperial' | 'metric', number]> = [
    [30, 'imperial', 30],
    ['30', 'imperial', 30],
    ['30 in', 'imperial', 30],
    ['30"', 'imperial', 30],
    [`2' 6"`, 'imperial', 30],
    [`2'-6 1/2"`, 'imperial', 30.5],
    ['2 ft 6-1/2 in', 'imperial', 30.5],
    ['29 1/2', 'imperial', 29.5],
    ['29-1/2', 'imperial', 29.5],
    ['29.5', 'imperial', 29.5],
    ['5 ft', 'imperial', 60],
    [`4'`, 'imperial', 48],
    ['3/4', 'imperial', 0.75],
    ['762 mm', 'imperial', 30],
    ['76.2 cm', 'imperial', 30],
    ['0.762 m', 'imperial', 30],
    [762, 'metric', 30], // bare numbers follow the plan's units
    ['762', 'metric', 30],
    ['30 in', 'metric', 30],
  ];
  it.each(cases)('%s (%s) = %d in', (input, units, expected) => {
    close(ok(parseLength(input, units, 'enclosure.width')), expected);
  });
  it('rejects negative and non-finite values with the field path', () => {
    for (const bad of [-1, Number.NaN, Number.POSITIVE_INFINITY, '-3 in']) {
      const r = parseLength(bad, 'imperial', 'enclosure.width');
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.error.path).toBe('enclosure.width');
    }
  });
  it('names the field and gives examples for text that is not a length', () => {
    const r = parseLength('30 furlongs', 'imperial', 'enclosure.width');
    expect(r).toEqual({
      ok: false,
      error: {
        path: 'enclosure.width',
        message: `Enclosure width: '30 furlongs' is not a length; use e.g. 30 in, 2' 6", 762 mm.`,
      },
    });
    expect(parseLength('', 'imperial', 'x').ok).toBe(false);
    expect(parseLength('1/0', 'imperial', 'x').ok).toBe(false);
    expect(parseLength('60 sq in', 'imperial', 'x').ok).toBe(false);
  });
});

describe('parseArea', () => {
  const cases: Array<[string | number, 'imperial' | 'metric', number]> = [
    [60, 'imperial', 60],
    ['60', 'imperial', 60],
    ['60 sq in', 'imperial', 60],
    ['60 in²', 'imperial', 60],
    ['0.5 sq ft', 'imperial', 72], // 1 sq ft = 144 sq in, exact
    ['645.16 cm²', 'imperial', 100], // NIST SP 811: 1 sq in = 6.4516 cm²
    ['645.16 cm2', 'imperial', 100],
    [645.16, 'metric', 100],
    ['0.064516 m²', 'imperial', 100],
  ];
  it.each(cases)('%s (%s) = %d sq in', (input, units, expected) => {
    const r = parseArea(input, units, 'makeupAir.openings.0.netFreeArea');
    if (!r.ok) throw new Error(r.error.message);
    close(r.value, expected);
  });
  it('387 cm², 387 cm2 and 0.04 m² follow 6.4516 cm² per sq in (NIST SP 811)', () => {
    for (const [text, cm2] of [['387 cm²', 387], ['387 cm2', 387], ['0.04 m²', 400]] as const) {
      const r = parseArea(text, 'imperial', 'a');
      if (!r.ok) throw new Error(r.error.message);
      close(r.value, cm2 / 6.4516);
    }
  });
  it('rejects lengths, negatives and junk', () => {
    expect(parseArea('30 in', 'imperial', 'a').ok).toBe(false);
    expect(parseArea(-5, 'imperial', 'a').ok).toBe(false);
    expect(parseArea('lots', 'imperial', 'a').ok).toBe(false);
  });
});

describe('formatLength and formatArea', () => {
  it('formats feet-inches to 1/16 in', () => {
    expect(formatLength(30.5, 'imperial')).toBe(`2' 6-1/2"`);
    expect(formatLength(7.25, 'imperial')).toBe(`7-1/4"`);
    expect(formatLength(42, 'imperial')).toBe(`3' 6"`);
    expect(formatLength(24, 'imperial')).toBe(`2' 0"`);
    expect(formatLength(12.125, 'imperial')).toBe(`1' 0-1/8"`);
    expect(formatLength(0.5, 'imperial')).toBe(`1/2"`);
    expect(formatLength(1 / 16, 'imperial')).toBe(`1/16"`);
    expect(formatLength(11.94, 'imperial')).toBe(`11-15/16"`);
    expect(formatLength(11.99, 'imperial')).toBe(`1' 0"`);
  });
  it('has a plain-inch and a decimal variant', () => {
    expect(formatLength(30.5, 'imperial', 'inches')).toBe(`30-1/2"`);
    // Thin material in thousandths of an inch or tenths of a millimetre (1 in = 25.4 mm, NIST SP 811): 0.0157 in = 0.399 mm.
    expect(formatLength(0.0157, 'imperial', 'decimal')).toBe('0.016"');
    expect(formatLength(0.0157, 'metric', 'decimal')).toBe('0.4 mm');
    expect(formatLength(0.0157, 'imperial', 'decimal-fine')).toBe('0.0157"');
  });
  it('formats metric lengths in mm (1 in = 25.4 mm, NIST SP 811)', () => {
    expect(formatLength(30, 'metric')).toBe('762 mm');
    expect(formatLength(0.0157, 'metric')).toBe('0.4 mm');
  });
  it('formats areas', () => {
    expect(formatArea(60, 'imperial')).toBe('60 sq in');
    expect(formatArea(60, 'metric')).toBe('387.1 cm²'); // 60 × 6.4516 = 387.096
  });
  it('round-trips what it prints', () => {
    for (const inches of [0.0625, 7.25, 29.5, 30.5, 84, 419.9375]) {
      close(ok(parseLength(formatLength(inches, 'imperial'), 'imperial', 'x')), inches);
    }
  });
});

describe('absurd magnitudes', () => {
  it('refuses lengths over 1,000 ft and areas over 1,000 sq ft, naming the field', async () => {
    const { parseLength, MAX_LENGTH_IN, MAX_AREA_SQ_IN } = await import('@/lib/domain/units');
    // 1,000 ft = 12,000 in; 1,000 sq ft = 144,000 sq in (1 ft = 12 in exactly, NIST SP 811).
    expect(MAX_LENGTH_IN).toBe(12_000);
    expect(MAX_AREA_SQ_IN).toBe(144_000);
    expect(parseLength('1000 ft', 'imperial', 'exhaust.run.0.straight')).toEqual({ ok: true, value: 12_000 });
    const big = parseLength(1e308, 'imperial', 'dryer.height');
    expect(big.ok).toBe(false);
    if (!big.ok) expect(big.error).toMatchObject({ path: 'dryer.height' });
    expect(parseLength('1001 ft', 'imperial', 'x').ok).toBe(false);
    expect(parseLength(304_800, 'metric', 'x')).toMatchObject({ ok: true }); // 304,800 mm / 25.4 = 12,000 in exactly
    expect(parseLength(305_000, 'metric', 'x').ok).toBe(false); // 12,007.9 in
  });
});
