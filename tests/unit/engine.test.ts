import { Engine } from 'json-rules-engine';
import { describe, expect, it, vi } from 'vitest';
import { clearCompiledRuleSets, evaluate } from '@/lib/domain/engine';
import { factCatalog } from '@/lib/domain/facts';
import { parsePlan } from '@/lib/domain/plan';
import { baselineRules, buildRuleSet } from '@/rules';
import { storedRuleSchema, validateRuleAgainstCatalog, type StoredRule } from '@/lib/domain/rule-format';
import { gasWalkInBedroomPlan, hallClosetPassPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';
import { check, EDITIONS_2018, finding, variant } from './support/check';

const ruleSet = buildRuleSet(EDITIONS_2018);

function canonical(input: unknown) {
  const parsed = parsePlan(input);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return parsed.plan;
}

describe('evaluate', () => {
  it('returns exactly one finding per enabled rule, with a summary that adds up', async () => {
    const evaluation = await check(longExhaustFailPlan);
    expect(evaluation.findings.map((f) => f.ruleKey)).toEqual(baselineRules.map((r) => r.key));
    const s = evaluation.summary;
    expect(s.pass + s.fail + s.caution + s.needsInfo + s.notApplicable).toBe(baselineRules.length);
    expect(evaluation.ruleSet).toEqual({ jurisdiction: 'Testville', version: 1 });
    expect(evaluation.facts['exhaust.developedLengthIn']).toBe(546);
  });

  it('skips disabled rules', async () => {
    const built = buildRuleSet(EDITIONS_2018, { rules: { 'service.toe-kick': { enabled: false } } });
    const evaluation = await evaluate({ jurisdiction: 'X', version: 2, ...built }, canonical(hallClosetPassPlan));
    expect(evaluation.findings).toHaveLength(baselineRules.length - 1);
    expect(evaluation.findings.some((f) => f.ruleKey === 'service.toe-kick')).toBe(false);
  });

  it('demo plans: the passing one has no fail, the long-exhaust one fails its route, the gas one is flagged', async () => {
    const pass = await check(hallClosetPassPlan);
    expect(pass.summary.fail).toBe(0);
    expect(pass.summary.needsInfo).toBe(0);
    const long = await check(longExhaustFailPlan);
    expect(finding(long, 'exhaust.developed-length').status).toBe('fail');
    expect(long.summary.fail).toBeGreaterThan(5);
    const gas = await check(gasWalkInBedroomPlan);
    const location = finding(gas, 'gas.location');
    // IRC G2406.2: a walk-in clothes closet opening into a bedroom never meets the exception.
    expect(location.status).toBe('fail');
    expect(location.message).toMatch(/walk-in clothes closet/);
    expect(location.message).toMatch(/Ask the AHJ/);
    expect(location.message).toMatch(/carbon monoxide/);
    expect(finding(gas, 'electrical.dryer-4-wire').status).toBe('not-applicable');
  });

  it('a plan with only its units gives needs-info naming plan fields, never a crash', async () => {
    const evaluation = await check({ units: 'imperial' });
    const developed = finding(evaluation, 'exhaust.developed-length');
    expect(developed.status).toBe('needs-info');
    expect(developed.missing).toEqual(['exhaust.run']);
    expect(developed.message).toBe('To check this, add to the plan: Exhaust route.');
    expect(developed.remedy).toBeNull();
    for (const f of evaluation.findings) expect(['needs-info', 'not-applicable']).toContain(f.status);
  });

  it('a missing optional field gives needs-info for its rule only', async () => {
    const evaluation = await check(variant((p) => delete p.plumbing.standpipeHeight));
    const standpipe = finding(evaluation, 'plumbing.standpipe-height');
    expect(standpipe.status).toBe('needs-info');
    expect(standpipe.missing).toEqual(['plumbing.standpipeHeight']);
    expect(evaluation.summary.needsInfo).toBe(1);
  });

  it('decides not-applicable before asking for facts the rule would need', async () => {
    // An electric dryer needs no gas details.
    const evaluation = await check(variant((p) => (p.gas = null)));
    expect(finding(evaluation, 'gas.shutoff').status).toBe('not-applicable');
    // A gas dryer without gas details is needs-info, not a crash and not a pass.
    const gas = await check(variant((p) => (p.dryer.fuel = 'gas')));
    expect(finding(gas, 'gas.shutoff').status).toBe('needs-info');
    expect(finding(gas, 'gas.shutoff').missing).toEqual(['gas.shutoffDistance', 'gas.shutoffSameRoom']);
  });

  it('shows values in the plan’s units and says which clause failed', async () => {
    const f = finding(await check(longExhaustFailPlan), 'electrical.laundry-circuit');
    expect(f.failedCondition).toBe('circuit-rating');
    expect(f.display).toEqual({ measured: '15 A', limit: '20 A' });
    const metric = finding(await check(gasWalkInBedroomPlan), 'clearances.rear-zone');
    expect(metric.display.limit).toBe('152.4 mm'); // 6 in × 25.4 mm (NIST SP 811)
    expect(metric.remedy).toMatch(/mm of depth/);
  });

  it('every finding defers to the local code and the AHJ', async () => {
    const evaluation = await check(longExhaustFailPlan);
    for (const f of evaluation.findings) expect(f.note).toMatch(/locally adopted code, its amendments and the AHJ govern/);
    expect(finding(evaluation, 'electrical.receptacle-reachable').note).toMatch(/from memory/);
    expect(finding(evaluation, 'service.removal-width').note).toMatch(/Common practice/);
    expect(finding(evaluation, 'service.toe-kick').note).toMatch(/secondary sources/);
  });

  it('builds a fresh Engine per evaluation and caches compiled JSON by rule set id', async () => {
    clearCompiledRuleSets();
    const plan = canonical(longExhaustFailPlan);
    const addRule = vi.spyOn(Engine.prototype, 'addRule');
    const run = vi.spyOn(Engine.prototype, 'run');
    const versioned = { id: 'rs-1', jurisdiction: 'X', version: 3, ...ruleSet };
    const first = await evaluate(versioned, plan);
    const [second, third] = await Promise.all([evaluate(versioned, plan), evaluate(versioned, plan)]);
    expect(run).toHaveBeenCalledTimes(3);
    expect(new Set(run.mock.contexts).size).toBe(3);
    expect(second.findings).toEqual(first.findings);
    expect(third.findings).toEqual(first.findings);
    // The cached JSON is frozen: had json-rules-engine mutated it, these runs would have thrown.
    const firstRuleJson = addRule.mock.calls[0][0];
    expect(Object.isFrozen(firstRuleJson)).toBe(true);
    addRule.mockRestore();
    run.mockRestore();
  });

  it('rejects facts of the wrong type before running', async () => {
    // A length entered as text would compare alphabetically under numeric operators.
    const plan = canonical(hallClosetPassPlan);
    const bad = { ...plan, exhaust: { ...plan.exhaust, run: [{ straight: '12' }] } };
    await expect(evaluate({ jurisdiction: 'X', version: 1, ...ruleSet }, bad as never)).rejects.toThrow();
  });
});

describe('stored rules', () => {
  it('every baseline rule stores in the schema and validates against the catalog', () => {
    for (const rule of ruleSet.rules) {
      expect(storedRuleSchema.safeParse(JSON.parse(JSON.stringify(rule))).success, rule.key).toBe(true);
      expect(validateRuleAgainstCatalog(rule), rule.key).toEqual([]);
    }
  });

  it('every condition has a name', () => {
    const rule = structuredClone(ruleSet.rules[0]) as StoredRule & { conditions: { all: Array<{ name?: string }> } };
    delete rule.conditions.all[0].name;
    expect(storedRuleSchema.safeParse(rule).success).toBe(false);
  });

  it('reports unknown facts, parameters and operators with field paths', () => {
    const rule = structuredClone(ruleSet.rules.find((r) => r.key === 'plumbing.standpipe-height')!) as unknown as {
      conditions: { all: Array<{ fact: string; operator: string; value: unknown }> };
      requires: string[];
    };
    rule.conditions.all[0].fact = 'plumbing.standpipeHeightFt';
    rule.conditions.all[1].operator = 'roughly';
    rule.conditions.all[1].value = { fact: 'params', path: '$.plumbing.standpipeMaximum' };
    const errors = validateRuleAgainstCatalog(rule);
    expect(errors).toEqual(
      expect.arrayContaining([
        { path: 'conditions.all.0.fact', message: "Unknown fact 'plumbing.standpipeHeightFt'." },
        expect.objectContaining({ path: 'conditions.all.1.operator' }),
        { path: 'conditions.all.1.value', message: "Unknown parameter '$.plumbing.standpipeMaximum'." },
        expect.objectContaining({ path: 'requires' }),
      ]),
    );
  });

  it('rejects numeric operators on boolean facts', () => {
    const rule = structuredClone(ruleSet.rules.find((r) => r.key === 'exhaust.no-screen')!) as unknown as {
      conditions: { all: Array<{ operator: string; value: unknown }> };
    };
    rule.conditions.all[0].operator = 'lessThan';
    rule.conditions.all[0].value = 1;
    expect(validateRuleAgainstCatalog(rule)).toEqual([
      { path: 'conditions.all.0.operator', message: "'lessThan' compares numbers, but 'exhaust.screen' is boolean." },
    ]);
  });

  it('the fact catalog names every fact the rules read, each once', () => {
    const names = factCatalog.map((f) => f.name);
    expect(new Set(names).size).toBe(names.length);
    for (const fact of factCatalog) expect(fact.description.length).toBeGreaterThan(10);
  });
});
