import { describe, expect, it } from 'vitest';
import { parsePlan } from '@/lib/domain/plan';
import { parseLength } from '@/lib/domain/units';

const errorsOf = (plan: unknown) => {
  const r = parsePlan(plan);
  return r.ok ? [] : r.errors;
};

describe('messages for values that are not numbers say what was typed and what is wanted', () => {
  it('names a word typed for a flow rate, with the unit in words and an example', () => {
    expect(errorsOf({ units: 'imperial', dryer: { exhaustCfm: 'lots' } })).toEqual([
      { path: 'dryer.exhaustCfm', message: 'Exhaust rate: “lots” is not a number; enter cubic feet per minute, e.g. 150.' },
    ]);
  });

  it('names a word typed for volts inside a list item', () => {
    expect(errorsOf({ units: 'imperial', electrical: { receptacles: [{ serves: 'dryer', volts: 'abc' }] } })).toEqual([
      { path: 'electrical.receptacles.0.volts', message: 'Receptacle 1, voltage: “abc” is not a number; enter volts, e.g. 240.' },
    ]);
  });

  it('says a rating must be more than 0 and repeats the number entered', () => {
    expect(errorsOf({ units: 'imperial', electrical: { laundryCircuit: { amps: -20 } } })).toEqual([
      { path: 'electrical.laundryCircuit.amps', message: 'Laundry circuit rating must be more than 0 A (you entered −20).' },
    ]);
    expect(errorsOf({ units: 'imperial', dryer: { exhaustCfm: -5 } })).toEqual([
      { path: 'dryer.exhaustCfm', message: 'Exhaust rate must be at least 0 cfm (you entered −5).' },
    ]);
  });

  it('keeps "required" for what is missing, and names the kind of value for other types', () => {
    expect(errorsOf({})).toEqual([{ path: 'units', message: 'Units for bare numbers: required.' }]);
    expect(errorsOf({ units: 'imperial', dryer: { fuel: 'coal' } })).toEqual([
      { path: 'dryer.fuel', message: 'Dryer fuel: “coal” is not one of "electric", "gas".' },
    ]);
    expect(errorsOf({ units: 'imperial', exhaust: { concealed: 'maybe' } })).toEqual([
      { path: 'exhaust.concealed', message: 'Duct concealed in a cavity: “maybe” is not yes or no.' },
    ]);
    const long = 'x'.repeat(5000);
    const [error] = errorsOf({ units: 'imperial', dryer: { exhaustCfm: long } });
    expect(error.message.length).toBeLessThan(120);
  });
});

describe('feet and inches', () => {
  it('refuses inches of 12 or more after the feet, naming the value', () => {
    for (const text of ['6 ft 14', `6' 14"`, '6 ft 12 in']) {
      const r = parseLength(text, 'imperial', '');
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.error.message).toContain('inches after the feet must be under 12');
    }
    // 6 ft 14 in is 86 in (6 × 12 + 14): offered as what may have been meant, never read silently.
    expect(errorsOf({ units: 'imperial', enclosure: { width: '6 ft 14' } })).toEqual([
      { path: 'enclosure.width', message: `Enclosure width: inches after the feet must be under 12 ('6 ft 14'); if you meant 7' 2", enter that or 86".` },
    ]);
  });

  it('still reads inches under 12 after the feet, and inches alone of any size', () => {
    expect(parseLength(`6' 11-1/2"`, 'imperial', '')).toEqual({ ok: true, value: 83.5 }); // 6 × 12 + 11.5
    expect(parseLength('86 in', 'imperial', '')).toEqual({ ok: true, value: 86 });
    expect(parseLength('14', 'imperial', '')).toEqual({ ok: true, value: 14 });
  });
});
