import { describe, expect, it } from 'vitest';
import { computeFacts, computeFactsWithMissing } from '@/lib/domain/facts';
import { defaultParameters } from '@/lib/domain/params';
import { parsePlan } from '@/lib/domain/plan';
import { EDITIONS_2018, findingFor, variant } from './support/check';

const params = defaultParameters(EDITIONS_2018);

function factsOf(input: unknown) {
  const parsed = parsePlan(input);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return computeFacts(parsed.plan, params);
}

describe('exhaust developed length', () => {
  it('worked example: two 4-in-radius mitered 90° elbows + 18 ft straight = 28 ft, under 35 ft', async () => {
    // IRC 2018 Table M1502.4.5.1: each 4-in radius mitered 90° elbow counts 5 ft; limit 35 ft (M1502.4.5.1).
    const plan = variant((p) => {
      p.exhaust.run = [{ straight: '10 ft' }, { elbow: 90, fitting: 'mitered' }, { straight: '8 ft' }, { elbow: 90, fitting: 'mitered' }];
    });
    expect(factsOf(plan)['exhaust.developedLengthIn']).toBe(28 * 12);
    const f = await findingFor('exhaust.developed-length', plan);
    expect(f.status).toBe('pass');
    expect(f.display).toEqual({ measured: `28' 0"`, limit: `35' 0"` });
    expect(f.citation).toEqual({ code: 'IRC', edition: '2018', section: 'M1502.4.5.1' });
  });

  it('counts each fitting at its table value', () => {
    // IRC 2018 Table M1502.4.5.1 rows: mitered 45° 2 ft 6 in; 6-in smooth 45° 1 ft, 90° 1 ft 9 in;
    // 8-in smooth 45° 1 ft, 90° 1 ft 7 in; 10-in smooth 45° 9 in, 90° 1 ft 6 in.
    const cases: Array<[string, 45 | 90, number]> = [
      ['mitered', 45, 30],
      ['mitered', 90, 60],
      ['smooth-6in', 45, 12],
      ['smooth-6in', 90, 21],
      ['smooth-8in', 45, 12],
      ['smooth-8in', 90, 19],
      ['smooth-10in', 45, 9],
      ['smooth-10in', 90, 18],
      ['other', 90, 60], // common practice, no published source: unlisted fittings at the mitered value
    ];
    for (const [fitting, elbow, inches] of cases) {
      const facts = factsOf(variant((p) => (p.exhaust.run = [{ straight: 12 }, { elbow, fitting }])));
      expect(facts['exhaust.developedLengthIn'], `${fitting} ${elbow}`).toBe(12 + inches);
    }
  });

  it('leaves the transition duct out of the developed length', () => {
    // IRC 2018 M1502.4.5.1: measured from the transition-duct connection.
    const short = factsOf(variant((p) => (p.exhaust.transition.length = '2 ft')));
    const long = factsOf(variant((p) => (p.exhaust.transition.length = '8 ft')));
    expect(short['exhaust.developedLengthIn']).toBe(long['exhaust.developedLengthIn']);
  });

  it('failing route: remedy removes the single elbow that suffices, or shortens the run', async () => {
    // IRC 2018 Table M1502.4.5.1: mitered 90° = 5 ft, mitered 45° = 2 ft 6 in; limit 35 ft.
    const plan = variant((p) => {
      p.exhaust.run = [
        { straight: '20 ft' },
        { elbow: 90, fitting: 'mitered' },
        { straight: '7 ft' },
        { elbow: 90, fitting: 'mitered' },
        { elbow: 45, fitting: 'mitered' },
      ];
    });
    // 240 + 60 + 84 + 60 + 30 = 474 in = 39 ft 6 in: 4 ft 6 in over. The 45° (2 ft 6 in) is not enough; a 90° (5 ft) is.
    const f = await findingFor('exhaust.developed-length', plan);
    expect(f.status).toBe('fail');
    expect(f.measured).toBe(474);
    expect(f.failedCondition).toBe('developed-length-within-limit');
    expect(f.remedy).toBe(`Remove one 4-in-radius mitered 90° elbow (counts 5' 0"), or shorten the straight run by 4' 6".`);
  });

  it('brief example: 3 ft 6 in over with a mitered 90° that would cover it', async () => {
    // IRC 2018 Table M1502.4.5.1: 33 ft 6 in straight + one mitered 90° (5 ft) = 38 ft 6 in, 3 ft 6 in over 35 ft.
    const plan = variant((p) => (p.exhaust.run = [{ straight: `33' 6"` }, { elbow: 90, fitting: 'mitered' }]));
    const f = await findingFor('exhaust.developed-length', plan);
    expect(f.remedy).toBe(`Remove one 4-in-radius mitered 90° elbow (counts 5' 0"), or shorten the straight run by 3' 6".`);
  });

  it('remedies in the plan units for a metric plan', async () => {
    // 11 m straight + one mitered 90° (5 ft = 1524 mm) = 12524 mm; 35 ft = 10668 mm (1 ft = 0.3048 m, NIST SP 811).
    const plan = variant((p) => {
      p.units = 'metric';
      p.exhaust.run = [{ straight: '11 m' }, { elbow: 90, fitting: 'mitered' }];
    });
    // The metric plan's other bare numbers now read as mm; only the exhaust finding matters here.
    const f = await findingFor('exhaust.developed-length', plan);
    expect(f.display).toEqual({ measured: '12524 mm', limit: '10668 mm' });
    expect(f.remedy).toBe('Shorten the straight run by 1856 mm.');
  });

  it('uses the maker’s maximum when given and allowed, else 35 ft', () => {
    // IRC 2018 M1502.4.5.2: the manufacturer's length replaces 35 ft.
    const withMaker = factsOf(variant((p) => (p.dryer.maxDuctLength = '64 ft')));
    expect(withMaker['exhaust.allowedLengthIn']).toBe(64 * 12);
    expect(withMaker['exhaust.allowedLengthSource']).toBe('manufacturer');
    const parsed = parsePlan(variant((p) => (p.dryer.maxDuctLength = '64 ft')));
    if (!parsed.ok) throw new Error();
    const noMaker = computeFacts(parsed.plan, { ...params, exhaust: { ...params.exhaust, allowManufacturerLength: false } });
    expect(noMaker['exhaust.allowedLengthIn']).toBe(420);
  });

  it('uses a listed power ventilator’s maximum', () => {
    // IRC 2018 M1502.4.5.3: length per the power ventilator's instructions.
    const facts = factsOf(variant((p) => (p.exhaust.boosterFan = { kind: 'power-ventilator', listed: true, maxDuctLength: '100 ft' })));
    expect(facts['exhaust.allowedLengthIn']).toBe(1200);
    expect(facts['exhaust.allowedLengthSource']).toBe('power-ventilator');
  });

  it('names the missing plan field when the route is absent', () => {
    const parsed = parsePlan(variant((p) => delete p.exhaust.run));
    if (!parsed.ok) throw new Error();
    const { facts, missing } = computeFactsWithMissing(parsed.plan, params);
    expect(facts['exhaust.developedLengthIn']).toBeNull();
    expect(missing['exhaust.developedLengthIn']).toEqual(['exhaust.run']);
  });

  it('duct outside size vs a 2x4 cavity', () => {
    // PS 20: a 2x4 wall cavity is 3-1/2 in deep; a 4-in duct with 0.019 in walls is 4.038 in outside.
    const facts = factsOf(variant((p) => (p.exhaust.cavityDepth = 3.5)));
    expect(facts['exhaust.ductOutsideIn']).toBeCloseTo(4.038, 9);
  });
});
