import { describe, expect, it } from 'vitest';
import { evaluate } from '@/lib/domain/engine';
import { parsePlan } from '@/lib/domain/plan';
import { amendmentErrors, amendmentsForRule, changedParameters, parametersRead } from '@/lib/domain/params/amendments';
import { PARAMETERS_SCHEMA_VERSION, upgradeParameters } from '@/lib/domain/params/upgrade';
import { ruleSetParametersSchema, type RuleSetParameters } from '@/lib/domain/params';
import { CHECK_SCHEMA_VERSION, readStoredCheck } from '@/lib/domain/checks/stored';
import { PLAN_SCHEMA_VERSION } from '@/lib/domain/plan/upgrade';
import { publishErrors } from '@/lib/domain/rule-sets/publish-check';
import { buildRuleSet } from '@/rules';
import { longExhaustFailPlan } from '@/tests/fixtures/plans';

const editions = { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC' as const, mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' };
const FT = 12;

function amended(change: (p: RuleSetParameters) => void): RuleSetParameters {
  const p = structuredClone(buildRuleSet(editions).parameters);
  change(p);
  return p;
}

// 35 ft → 30 ft: the model maximum is IRC 2021 M1502.4.6.1 (TRADE.md, dryer exhaust, V).
const shorter = (p: RuleSetParameters) => {
  p.exhaust.maxDevelopedLengthIn = 30 * FT;
};

describe('a changed model value carries its local amendment', () => {
  it('model values need no citation', () => {
    expect(changedParameters(buildRuleSet(editions).parameters)).toEqual([]);
    expect(amendmentErrors(buildRuleSet(editions).parameters)).toEqual([]);
  });

  it('refuses 35 ft → 30 ft without a citation, naming the parameter and both values', () => {
    const errors = amendmentErrors(amended(shorter));
    expect(errors).toHaveLength(1);
    expect(errors[0].path).toBe('parameters.exhaust.maxDevelopedLengthIn');
    // 420 in = 35 ft (IRC 2021 M1502.4.6.1); 360 in = 30 ft.
    expect(errors[0].message).toContain(`35' 0"`);
    expect(errors[0].message).toContain(`30' 0"`);
    expect(errors[0].message).toMatch(/ordinance or amendment section/);
    // Publishing a draft copied with the uncited change is refused the same way.
    expect(publishErrors({ parameters: amended(shorter), rules: buildRuleSet(editions).rules }).map((e) => e.path)).toContain('parameters.exhaust.maxDevelopedLengthIn');
  });

  it('accepts it with the amendment cited, and refuses citations of parameters that do not exist', () => {
    const cited = amended((p) => {
      shorter(p);
      p.amendments = [{ parameter: 'exhaust.maxDevelopedLengthIn', citation: 'Ord. 12-34 §2 (demo)' }];
    });
    expect(amendmentErrors(cited)).toEqual([]);
    const wrong = amended((p) => {
      p.amendments = [{ parameter: 'exhaust.noSuchThing', citation: 'Ord. 1' }];
    });
    expect(amendmentErrors(wrong).map((e) => e.path)).toEqual(['parameters.amendments.0.parameter']);
  });

  it('lets a drain-pan policy be cited by its own section parameter (no model-code requirement: TRADE.md, washer pan)', () => {
    const pan = amended((p) => {
      p.plumbing.drainPanPolicy = 'over-finished-space';
      p.plumbing.drainPanSection = 'DC-406.3 (demo)';
    });
    expect(amendmentErrors(pan)).toEqual([]);
    const uncited = amended((p) => {
      p.plumbing.drainPanPolicy = 'always';
    });
    expect(amendmentErrors(uncited).map((e) => e.path)).toEqual(['parameters.plumbing.drainPanPolicy']);
  });

  it('a deleted termination clause (3 ft, IRC M1502.3; some states delete it) needs its amendment too', () => {
    expect(amendmentErrors(amended((p) => { p.exhaust.terminationClearanceIn = null; })).map((e) => e.path)).toEqual(['parameters.exhaust.terminationClearanceIn']);
  });

  it('the finding cites both the amendment and the model section', async () => {
    const built = buildRuleSet(editions);
    const parameters = amended((p) => {
      shorter(p);
      p.amendments = [{ parameter: 'exhaust.maxDevelopedLengthIn', citation: 'Ord. 12-34 §2 (demo)' }];
    });
    const parsed = parsePlan(longExhaustFailPlan);
    if (!parsed.ok) throw new Error('fixture must parse');
    const evaluation = await evaluate({ jurisdiction: 'demo', version: 1, parameters, rules: built.rules }, parsed.plan);
    const length = evaluation.findings.find((f) => f.ruleKey === 'exhaust.developed-length')!;
    expect(length.citation).toMatchObject({ code: 'IRC', edition: '2021', section: 'M1502.4.6.1' }); // IRC 2021 M1502.4.6.1
    expect(length.amendments).toEqual([{ parameter: 'exhaust.maxDevelopedLengthIn', citation: 'Ord. 12-34 §2 (demo)', modelValue: 35 * FT, value: 30 * FT }]);
    expect(length.note).toContain('Ord. 12-34 §2 (demo)');
    expect(length.note).toContain('IRC 2021 M1502.4.6.1');
    // A rule that reads no amended parameter cites no amendment.
    expect(evaluation.findings.find((f) => f.ruleKey === 'exhaust.transition-length')?.amendments ?? []).toEqual([]);
  });

  it('finds the parameters a rule reads directly in its conditions and limit', () => {
    const rule = buildRuleSet(editions).rules.find((r) => r.key === 'plumbing.standpipe-height')!;
    // IRC P2706.2 / IPC 802.4: 18–42 in above the trap weir (TRADE.md, plumbing, S), read from the parameters.
    expect(parametersRead(rule.conditions, rule.applicability, rule.limit).sort()).toEqual(['plumbing.standpipeMaxIn', 'plumbing.standpipeMinIn']);
    expect(amendmentsForRule(rule, buildRuleSet(editions).parameters)).toEqual([]);
  });
});

describe('stored rule sets and checks written before amendments were cited', () => {
  it('version 1 parameters read with an empty amendment list and still parse', () => {
    const { amendments: _a, ...v1 } = amended(shorter);
    expect(PARAMETERS_SCHEMA_VERSION).toBe(3);
    const read = upgradeParameters(v1, 1) as RuleSetParameters;
    expect(read.amendments).toEqual([]);
    expect(read.exhaust.maxDevelopedLengthIn).toBe(30 * FT); // the old value is kept, never rewritten
    expect(ruleSetParametersSchema.safeParse(read).success).toBe(true);
  });

  it('version 1 checks read with findings that cite no amendment, findings otherwise as stored', () => {
    expect(CHECK_SCHEMA_VERSION).toBe(3);
    const finding = { ruleKey: 'exhaust.developed-length', status: 'fail', message: 'as stored' };
    const stored = { inputs: { plan: {}, canonical: {}, planSchemaVersion: PLAN_SCHEMA_VERSION }, facts: {}, findings: [finding], summary: {} };
    const read = readStoredCheck(stored, 1);
    expect(read.findings).toEqual([{ ...finding, amendments: [] }]);
    expect(stored.findings[0]).toEqual(finding); // the stored value itself is untouched
  });
});
