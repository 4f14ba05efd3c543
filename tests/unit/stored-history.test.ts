import { describe, expect, it } from 'vitest';
import { CHECK_SCHEMA_VERSION, checkUpgrades, readStoredCheck } from '@/lib/domain/checks/stored';
import { evaluate } from '@/lib/domain/engine';
import { missingSteps, StoredVersionError, unchanged, upgradeStored, type UpgradeChain } from '@/lib/domain/history/upgrade';
import { defaultParameters, ruleSetParametersSchema } from '@/lib/domain/params';
import { PARAMETERS_SCHEMA_VERSION, parameterUpgrades, upgradeParameters } from '@/lib/domain/params/upgrade';
import { parsePlan } from '@/lib/domain/plan';
import { PLAN_SCHEMA_VERSION, planUpgrades, readStoredPlan, upgradePlan } from '@/lib/domain/plan/upgrade';
import { readStoredReport, REPORT_SCHEMA_VERSION, reportUpgrades } from '@/lib/domain/reports/stored';
import { buildRuleSet } from '@/rules';
import { demoPlans, hallClosetPassPlan } from '@/tests/fixtures/plans';
import { check, EDITIONS_2018, finding, variant, type LoosePlan } from './support/check';

/*
 * The production chains hold the step from version 0 ("written before versions were recorded") to 1,
 * and for parameters the exhaust limits added in version 2. The made-up chains below play out other
 * changes, a renamed plan field and an added parameter, through the same machinery.
 */

function canonical(input: unknown) {
  const parsed = parsePlan(input);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return parsed.plan;
}

// Made up: plan version 1 called the terminal's damper `exhaust.termination.damper`; version 2 renamed it.
const renamedDamper: UpgradeChain = {
  what: 'Plan',
  current: 2,
  steps: {
    0: unchanged,
    1: (stored) => {
      const plan = stored as LoosePlan;
      const termination = plan.exhaust?.termination;
      if (!termination || !('damper' in termination)) return plan;
      const { damper, ...rest } = termination;
      return { ...plan, exhaust: { ...plan.exhaust, termination: { ...rest, backdraftDamper: damper } } };
    },
  },
};

/** The passing demo plan as version 1 of the made-up chain stored it. */
function planStoredAsV1(damper: boolean) {
  return variant((p) => {
    delete p.exhaust.termination.backdraftDamper;
    p.exhaust.termination.damper = damper;
  });
}

// Made up: parameters version 1 had no `exhaust.boosterFanPolicy` and accepted any listed fan; version 2 added it.
const addedFanPolicy: UpgradeChain = {
  what: 'Rule set parameters',
  current: 2,
  steps: {
    0: unchanged,
    1: (stored) => {
      const params = stored as LoosePlan;
      // 'listed-fans' keeps version 1's meaning: any listed fan was accepted.
      return { ...params, exhaust: { boosterFanPolicy: 'listed-fans', ...params.exhaust } };
    },
  },
};

function parametersStoredAsV1() {
  const params = structuredClone(defaultParameters(EDITIONS_2018)) as LoosePlan;
  delete params.exhaust.boosterFanPolicy;
  return params;
}

describe('upgradeStored', () => {
  const calls: string[] = [];
  const chain: UpgradeChain = {
    what: 'Thing',
    current: 3,
    steps: {
      0: (v) => (calls.push('0→1'), { ...(v as object), one: true }),
      1: (v) => (calls.push('1→2'), { ...(v as object), two: true }),
      2: (v) => (calls.push('2→3'), { ...(v as object), three: true }),
    },
  };

  it('runs each step once, in order, from the stored version to the current one', () => {
    calls.length = 0;
    expect(upgradeStored({ zero: true }, 1, chain)).toEqual({ zero: true, two: true, three: true });
    expect(calls).toEqual(['1→2', '2→3']);
    calls.length = 0;
    expect(upgradeStored({}, 0, chain)).toEqual({ one: true, two: true, three: true });
    expect(calls).toEqual(['0→1', '1→2', '2→3']);
  });

  it('hands back a value of the current version as it is', () => {
    const stored = { three: true };
    expect(upgradeStored(stored, 3, chain)).toBe(stored);
  });

  it('refuses a version newer than the build knows, naming both', () => {
    expect(() => upgradeStored({}, 4, chain)).toThrow(StoredVersionError);
    expect(() => upgradeStored({}, 4, chain)).toThrow(/Thing was written with schema version 4, but this build reads versions up to 3/);
  });

  it('refuses what is not a version number', () => {
    for (const bad of [-1, 1.5, Number.NaN, undefined as unknown as number]) {
      expect(() => upgradeStored({}, bad, chain)).toThrow(/not a version number/);
    }
  });

  it('names the missing step of an incomplete chain', () => {
    const gappy: UpgradeChain = { what: 'Thing', current: 3, steps: { 0: unchanged, 2: unchanged } };
    expect(missingSteps(gappy)).toEqual([1]);
    expect(() => upgradeStored({}, 0, gappy)).toThrow(/no upgrade step from schema version 1 to 2/);
  });

  it("never edits the caller's value, even when a step edits its argument", () => {
    const sloppy: UpgradeChain = {
      what: 'Thing',
      current: 1,
      steps: { 0: (v) => Object.assign(v as object, { touched: true }) },
    };
    const stored = { nested: { a: 1 } };
    expect(upgradeStored(stored, 0, sloppy)).toEqual({ nested: { a: 1 }, touched: true });
    expect(stored).toEqual({ nested: { a: 1 } });
  });
});

describe('the production chains', () => {
  it('reach the versions writers stamp, with a step from every older version', () => {
    const chains: Array<[UpgradeChain, number]> = [
      [planUpgrades, PLAN_SCHEMA_VERSION],
      [parameterUpgrades, PARAMETERS_SCHEMA_VERSION],
      [checkUpgrades, CHECK_SCHEMA_VERSION],
      [reportUpgrades, REPORT_SCHEMA_VERSION],
    ];
    for (const [chain, version] of chains) {
      expect(chain.current).toBe(version);
      expect(missingSteps(chain), chain.what).toEqual([]);
    }
  });

  it('read a plan and parameters of version 0 as they were: the shape did not change when versions began', () => {
    for (const demo of demoPlans) expect(upgradePlan(demo.plan, 0)).toEqual(demo.plan);
    const params = defaultParameters(EDITIONS_2018);
    expect(upgradeParameters(params, 0)).toEqual(params);
    expect(readStoredReport({ attachmentIds: ['a'] }, 0)).toEqual({ attachmentIds: ['a'] });
  });

  it('read parameters of version 1 with the exhaust limits version 2 added, at their editions’ model values', () => {
    const asV1 = (editions: typeof EDITIONS_2018) => {
      const params = defaultParameters(editions) as LoosePlan;
      delete params.exhaust.maxSupportSpacingIn;
      delete params.exhaust.minTerminalOpeningSqIn;
      delete params.exhaust.shieldPlateMinClearanceIn;
      return params;
    };
    for (const building of ['IRC 2012', 'IRC 2015', 'IRC 2018', 'IRC 2021']) {
      const editions = { ...EDITIONS_2018, building };
      const stored = asV1(editions);
      expect(ruleSetParametersSchema.safeParse(stored).success).toBe(false);
      expect(ruleSetParametersSchema.parse(upgradeParameters(stored, 1))).toEqual(defaultParameters(editions));
    }
    // IRC M1502.4.2: 12 ft from 2015, none before; IRC 2018 M1502.3: 12.5 sq in; IRC M1502.5: 1-1/4 in (TRADE.md S).
    const irc2012 = upgradeParameters(asV1({ ...EDITIONS_2018, building: 'IRC 2012' }), 1) as LoosePlan;
    expect(irc2012.exhaust).toMatchObject({ maxSupportSpacingIn: null, minTerminalOpeningSqIn: null, shieldPlateMinClearanceIn: 1.25 });
    const irc2018 = upgradeParameters(asV1(EDITIONS_2018), 1) as LoosePlan;
    expect(irc2018.exhaust).toMatchObject({ maxSupportSpacingIn: 144, minTerminalOpeningSqIn: 12.5 });
  });

  it('refuse rows written by a newer build', () => {
    expect(() => upgradePlan(hallClosetPassPlan, PLAN_SCHEMA_VERSION + 1)).toThrow(/Plan was written with schema version/);
    expect(() => upgradeParameters({}, PARAMETERS_SCHEMA_VERSION + 1)).toThrow(/Rule set parameters was written with schema version/);
    expect(() => readStoredReport({ attachmentIds: [] }, REPORT_SCHEMA_VERSION + 1)).toThrow(StoredVersionError);
  });
});

describe('a plan field since renamed (made-up chain)', () => {
  it('is refused by today’s schema as stored, and parses once upgraded', () => {
    const stored = planStoredAsV1(true);
    const before = parsePlan(stored);
    expect(before.ok).toBe(false);
    if (!before.ok) expect(before.errors).toContainEqual(expect.objectContaining({ path: 'exhaust.termination.damper' }));
    const upgraded = upgradePlan(stored, 1, renamedDamper) as LoosePlan;
    expect(upgraded.exhaust.termination).toEqual({ ...hallClosetPassPlan.exhaust.termination, backdraftDamper: true });
    expect(canonical(upgraded)).toEqual(canonical(hallClosetPassPlan));
  });

  it('evaluates with the value it was stored with', async () => {
    // IRC M1502.3: the exhaust terminal needs a backdraft damper (rules/exhaust.ts cites it).
    expect(finding(await check(upgradePlan(planStoredAsV1(true), 1, renamedDamper)), 'exhaust.backdraft-damper').status).toBe('pass');
    expect(finding(await check(upgradePlan(planStoredAsV1(false), 1, renamedDamper)), 'exhaust.backdraft-damper').status).toBe('fail');
  });

  it('runs every step from version 0', () => {
    expect(upgradePlan(planStoredAsV1(true), 0, renamedDamper)).toEqual(hallClosetPassPlan);
  });

  it('re-derives the canonical form of an old revision, and keeps a current one as stored', () => {
    const old = readStoredPlan({ plan: planStoredAsV1(true), canonical: { stale: true } }, 1, renamedDamper);
    expect(old.plan).toEqual(hallClosetPassPlan);
    expect(old.canonical).toEqual(canonical(hallClosetPassPlan));
    const current = { stored: 'as written' };
    expect(readStoredPlan({ plan: hallClosetPassPlan, canonical: current }, 2, renamedDamper).canonical).toBe(current);
    // An old plan that no longer parses after upgrade has no canonical form today; its plan is still readable.
    const broken = readStoredPlan({ plan: { units: 'imperial', enclosure: { width: 'wide' } }, canonical: {} }, 1, renamedDamper);
    expect(broken).toEqual({ plan: { units: 'imperial', enclosure: { width: 'wide' } }, canonical: null });
  });
});

describe('a rule-set parameter since added (made-up chain)', () => {
  const plan = variant((p) => (p.exhaust.boosterFan = { kind: 'booster', listed: true }));

  it('is refused by today’s schema as stored, and parses once upgraded', () => {
    const before = ruleSetParametersSchema.safeParse(parametersStoredAsV1());
    expect(before.success).toBe(false);
    expect(before.error?.issues.map((i) => i.path.join('.'))).toContain('exhaust.boosterFanPolicy');
    const upgraded = upgradeParameters(parametersStoredAsV1(), 1, addedFanPolicy);
    expect(ruleSetParametersSchema.parse(upgraded)).toEqual(defaultParameters(EDITIONS_2018));
  });

  it('evaluates under the meaning it was stored with', async () => {
    const { rules } = buildRuleSet(EDITIONS_2018);
    await expect(evaluate({ jurisdiction: 'Testville', version: 1, parameters: parametersStoredAsV1(), rules }, canonical(plan))).rejects.toThrow();
    const evaluation = await evaluate(
      { jurisdiction: 'Testville', version: 1, parameters: upgradeParameters(parametersStoredAsV1(), 1, addedFanPolicy) as never, rules },
      canonical(plan),
    );
    // IRC 2018 M1502.4.4 accepts a listed booster fan (as rules-editions.test.ts checks for the baseline).
    expect(finding(evaluation, 'exhaust.booster-fan').status).toBe('pass');
  });
});

describe('readStoredCheck', () => {
  const findings = [{ ruleKey: 'exhaust.backdraft-damper', status: 'pass', message: 'as stored' }];
  const summary = { pass: 1, fail: 0, caution: 0, needsInfo: 0, notApplicable: 0 };
  const facts = { 'exhaust.backdraftDamper': true };

  it('reads a check from before versions were recorded: its plan is a plan of version 0', () => {
    const calls: number[] = [];
    const plan: UpgradeChain = { ...renamedDamper, steps: { ...renamedDamper.steps, 0: (v) => (calls.push(0), v) } };
    const stored = { inputs: { plan: planStoredAsV1(true), canonical: { as: 'evaluated' } }, facts, findings, summary };
    const read = readStoredCheck(stored, 0, { check: checkUpgrades, plan });
    expect(calls).toEqual([0]);
    expect(read.inputs).toEqual({ plan: hallClosetPassPlan, canonical: { as: 'evaluated' } });
  });

  it('upgrades the plan from the version the check recorded, and keeps findings, facts and summary as stored', () => {
    const stored = { inputs: { plan: planStoredAsV1(false), canonical: { as: 'evaluated' }, planSchemaVersion: 1 }, facts, findings, summary };
    const read = readStoredCheck(stored, CHECK_SCHEMA_VERSION, { check: checkUpgrades, plan: renamedDamper });
    expect((read.inputs.plan as LoosePlan).exhaust.termination.backdraftDamper).toBe(false);
    expect(read.findings).toBe(findings);
    expect(read.facts).toBe(facts);
    expect(read.summary).toBe(summary);
  });

  it('refuses a check written by a newer build', () => {
    expect(() => readStoredCheck({ inputs: {}, facts, findings, summary }, CHECK_SCHEMA_VERSION + 1)).toThrow(/Check was written with schema version/);
  });
});
