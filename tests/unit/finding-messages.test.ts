import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluate, type Finding } from '@/lib/domain/engine';
import { factsByName } from '@/lib/domain/facts';
import { entryAt, parsePlan, registryEntries, type PlanInput } from '@/lib/domain/plan';
import { buildRuleSet } from '@/rules';
import { fixturePlans, generatedPlan } from '@/tests/fixtures/generated-plans';
import { EDITIONS_2018, EDITIONS_2021 } from './support/check';

const factNames = new Set(factsByName.keys());

/** Every way a finding speaks to people: its message, the smallest fix, the values shown, the note. */
function texts(f: Finding): string[] {
  return [f.message, f.remedy, f.display.measured, f.display.limit, f.note].filter((t): t is string => t !== null);
}

/** What a message must never show: a plan path or fact name, null/undefined/NaN, a number with more than 3 decimals. */
function problems(text: string): string[] {
  const out: string[] = [];
  for (const [token] of text.matchAll(/[a-zA-Z]+(?:\.[a-zA-Z0-9*]+)+/g)) {
    if (entryAt(token) || factNames.has(token)) out.push(`names ${token}`);
  }
  for (const [word] of text.matchAll(/\b(?:null|undefined|NaN)\b/g)) out.push(`says ${word}`);
  for (const [number] of text.matchAll(/\d+\.\d{4,}/g)) out.push(`shows ${number}`);
  return out;
}

function without(plan: unknown, path: string): unknown {
  const copy = structuredClone(plan) as Record<string, unknown>;
  const keys = path.split('.');
  let node: unknown = copy;
  for (const key of keys.slice(0, -1)) {
    if (node === null || typeof node !== 'object') return copy;
    node = (node as Record<string, unknown>)[key === '*' ? '0' : key];
  }
  if (node && typeof node === 'object') delete (node as Record<string, unknown>)[keys[keys.length - 1]];
  return copy;
}

async function findingsOf(plan: unknown): Promise<Finding[]> {
  const parsed = parsePlan(plan);
  if (!parsed.ok) return [];
  const out: Finding[] = [];
  for (const editions of [EDITIONS_2018, EDITIONS_2021]) {
    out.push(...(await evaluate({ jurisdiction: 'Testville', version: 1, ...buildRuleSet(editions) }, parsed.plan)).findings);
  }
  return out;
}

describe('finding messages speak the trade, in the plan’s units', () => {
  it('name no plan path and show no machine numbers, for the fixtures, each with one field left out, and generated plans', async () => {
    const plans: unknown[] = [...fixturePlans];
    for (const base of fixturePlans) {
      plans.push({ ...base, units: base.units === 'metric' ? 'imperial' : 'metric' });
      for (const { path } of registryEntries) if (path !== 'units') plans.push(without(base, path));
    }
    plans.push(...fc.sample(generatedPlan, { numRuns: 60, seed: 16 }));
    const found: string[] = [];
    let checked = 0;
    for (const plan of plans) {
      for (const f of await findingsOf(plan)) {
        for (const text of texts(f)) {
          checked += 1;
          for (const p of problems(text)) found.push(`${f.ruleKey} ${f.status}: ${p} in "${text}"`);
        }
      }
    }
    expect(checked).toBeGreaterThan(10_000);
    expect([...new Set(found)].slice(0, 20)).toEqual([]);
  }, 120_000);

  it('the checker itself catches each kind of problem', () => {
    expect(problems('Fill in: exhaust.material')).toEqual(['names exhaust.material']);
    expect(problems('Needs exhaust.thicknessIn and doors.0.hinges')).toEqual(['names exhaust.thicknessIn', 'names doors.0.hinges']);
    expect(problems('Limit null, measured NaN')).toEqual(['says null', 'says NaN']);
    expect(problems('Duct wall 0.0157 in')).toEqual(['shows 0.0157']);
    expect(problems('Use e.g. 0.016" duct; Door 1, hinge 2')).toEqual([]);
  });

  it('shows a duct wall in thousandths of an inch or tenths of a millimetre', async () => {
    // IRC 2018 M1502.4.1: 0.0157 in (No. 28 gage) minimum; 1 in = 25.4 mm (NIST SP 811), so 0.015 in = 0.381 mm.
    const base = fixturePlans[0] as PlanInput & { exhaust: Record<string, unknown> };
    const thin = { ...base, exhaust: { ...base.exhaust, material: 'rigid-metal', thickness: '0.015 in' } };
    const [imperial] = (await findingsOf(thin)).filter((f) => f.ruleKey === 'exhaust.thickness');
    expect(imperial.status).toBe('fail');
    expect(imperial.display).toEqual({ measured: '0.015"', limit: '0.016"' });
    expect(imperial.remedy).toBe('Use duct with a wall of at least 0.016".');
    const [metric] = (await findingsOf({ ...thin, units: 'metric' })).filter((f) => f.ruleKey === 'exhaust.thickness');
    // Both round to 0.4 mm, so one more digit tells them apart.
    expect(metric.display).toEqual({ measured: '0.38 mm', limit: '0.4 mm' });
  });
});
