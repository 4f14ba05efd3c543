import { describe, expect, it } from 'vitest';
import { failingBySection, sectionsOfRule } from '@/lib/domain/checks/sections';
import { evaluate } from '@/lib/domain/engine';
import { parsePlan } from '@/lib/domain/plan';
import { MAX_PHOTO_SIDE_PX, scaledSize } from '@/lib/platform/client/photo-upload';
import { buildRuleSet } from '@/rules';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';

const county = { building: 'IRC 2018', electrical: 'NEC 2017', plumbing: 'IPC 2018', plumbingFamily: 'IPC', mechanical: 'IMC 2018', fuelGas: 'IFGC 2018' } as const;

describe('photo scaling before upload', () => {
  it('brings the longest side down to 2,560 px and keeps the aspect ratio', () => {
    expect(MAX_PHOTO_SIDE_PX).toBe(2560);
    // 4000 / 2560 = 1.5625, and 3000 / 1.5625 = 1920 exactly (arithmetic).
    expect(scaledSize(4000, 3000)).toEqual({ width: 2560, height: 1920, scaled: true });
    // A portrait photo: the height is the longest side.
    expect(scaledSize(3000, 4000)).toEqual({ width: 1920, height: 2560, scaled: true });
    // 4032 × 3024 (a 4:3 sensor, from memory): 3024 × 2560 / 4032 = 1920.
    expect(scaledSize(4032, 3024)).toEqual({ width: 2560, height: 1920, scaled: true });
    // A panorama: 100 × 2560 / 6000 = 42.67, rounded to 43.
    expect(scaledSize(6000, 100)).toEqual({ width: 2560, height: 43, scaled: true });
  });

  it('leaves photos at or under the limit alone and never enlarges', () => {
    expect(scaledSize(2560, 1440)).toEqual({ width: 2560, height: 1440, scaled: false });
    expect(scaledSize(800, 600)).toEqual({ width: 800, height: 600, scaled: false });
    expect(scaledSize(2561, 2561)).toEqual({ width: 2560, height: 2560, scaled: true });
  });

  it('keeps a sliver at least one pixel wide and refuses an image without a size', () => {
    expect(scaledSize(1, 9000)).toEqual({ width: 1, height: 2560, scaled: true });
    expect(() => scaledSize(0, 100)).toThrow(RangeError);
    expect(() => scaledSize(Number.NaN, 100)).toThrow(RangeError);
  });
});

describe('failing findings per editor section', () => {
  const ruleSet = buildRuleSet(county);
  const rule = (key: string) => ruleSet.rules.find((r) => r.key === key)!;

  it('places a rule in the sections of the plan fields it reads', () => {
    // The developed length reads the exhaust route and the dryer maker's maximum length.
    expect(sectionsOfRule(rule('exhaust.developed-length')).sort()).toEqual(['dryer', 'exhaust']);
  });

  it('counts only failing findings, once in each section they concern', async () => {
    // 20 ft + 8 ft of straight duct and two mitered 90° elbows at 5 ft each (IRC 2018 Table M1502.4.5.1) is
    // 38 ft, over the 35 ft of IRC 2018 M1502.4.5.1.
    const long = { ...hallClosetPassPlan, exhaust: { ...hallClosetPassPlan.exhaust, run: [{ straight: '20 ft' }, { elbow: 90, fitting: 'mitered' }, { straight: `8'` }, { elbow: 90, fitting: 'mitered' }] } };
    const parsed = parsePlan(long);
    if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
    const passing = parsePlan(hallClosetPassPlan);
    if (!passing.ok) throw new Error(JSON.stringify(passing.errors));
    const before = failingBySection((await evaluate({ jurisdiction: 'demo', version: 1, ...ruleSet }, passing.plan)).findings, ruleSet.rules);
    const after = failingBySection((await evaluate({ jurisdiction: 'demo', version: 1, ...ruleSet }, parsed.plan)).findings, ruleSet.rules);
    expect((after.exhaust ?? 0) - (before.exhaust ?? 0)).toBe(1);
    expect((after.dryer ?? 0) - (before.dryer ?? 0)).toBe(1);
    expect(after.enclosure ?? 0).toBe(before.enclosure ?? 0);

    const findings = [
      { ruleKey: 'exhaust.developed-length', status: 'fail' as const },
      { ruleKey: 'exhaust.developed-length', status: 'caution' as const },
      { ruleKey: 'exhaust.developed-length', status: 'needs-info' as const },
      { ruleKey: 'no.such-rule', status: 'fail' as const },
    ];
    expect(failingBySection(findings, ruleSet.rules)).toEqual({ exhaust: 1, dryer: 1 });
  });
});
