import { describe, expect, it } from 'vitest';
import { formToPlan, planToForm } from '@/components/plan-editor/form-values';
import { parsePlan } from '@/lib/domain/plan';
import { demoPlans } from '@/tests/fixtures/plans';
import { diffPlans, summarizeChanges } from '@/lib/domain/revisions/change-summary';

function canonical(input: unknown) {
  const parsed = parsePlan(input);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return parsed.plan;
}

describe('plan editor form values', () => {
  for (const demo of demoPlans) {
    it(`round-trips the ${demo.slug} plan without losing or changing a value`, () => {
      const back = formToPlan(planToForm(demo.plan));
      expect(canonical(back)).toEqual(canonical(demo.plan));
    });
  }

  it('leaves blank fields out so they become needs-info, and reads yes/no selects as booleans', () => {
    const values = planToForm(null);
    values.enclosure.width = '2\' 6"';
    values.exhaust.termination.backdraftDamper = 'no';
    values.dryer.fuel = 'electric';
    const plan = formToPlan(values);
    expect(plan).toEqual({
      units: 'imperial',
      enclosure: { width: `2' 6"` },
      dryer: { fuel: 'electric' },
      exhaust: { termination: { backdraftDamper: false } },
      gas: null,
    });
    // 2 ft 6 in = 30 in (1 ft = 12 in exactly, NIST SP 811).
    expect(canonical(plan).enclosure?.width).toBe(30);
  });

  it('reads hinge lists and bare numbers in the plan’s units', () => {
    const values = planToForm({ units: 'metric', doors: [{ height: 2000, hinges: [100, 950, 1900] }] });
    expect(values.doors[0].hinges).toBe('100, 950, 1900');
    values.doors[0].hinges = '100; 37 in, 1900';
    const plan = canonical(formToPlan(values));
    // 100 mm = 3.937 in and 37 in stays 37 in (1 in = 25.4 mm, NIST SP 811).
    expect(plan.doors?.[0].hinges?.[0]).toBeCloseTo(100 / 25.4, 9);
    expect(plan.doors?.[0].hinges?.[1]).toBe(37);
  });

  it('keeps text that is not a number so the schema can name the field', () => {
    const values = planToForm({ units: 'imperial' });
    values.dryer.exhaustCfm = 'lots';
    const parsed = parsePlan(formToPlan(values));
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.errors[0].path).toBe('dryer.exhaustCfm');
  });
});

describe('revision change summary', () => {
  it('lists changed fields with before and after', () => {
    const before = { units: 'imperial', enclosure: { width: 54 }, exhaust: { run: [{ straight: 24 }] } };
    const after = { units: 'imperial', enclosure: { width: 56 }, exhaust: { run: [{ straight: 24 }, { elbow: 90 }] } };
    const changes = diffPlans(before, after);
    expect(changes.map((c) => c.path)).toEqual(['enclosure.width', 'exhaust.run.1']);
    expect(summarizeChanges(changes)).toBe('Enclosure width 54 → 56; Exhaust piece 2 — → (elbow angle 90)');
    expect(summarizeChanges([])).toBe('No changes');
  });

  it('compares a list longer than any plan may hold as one change, quickly', () => {
    const door = { kind: 'hinged', height: 78, hinges: [3, 75] };
    const stored = { units: 'imperial', doors: [{ ...door, hinges: Array.from({ length: 100_000 }, (_, i) => 1 + (i % 70)) }, ...Array.from({ length: 4_999 }, () => door)] };
    const started = performance.now();
    const changes = diffPlans(stored, { units: 'imperial', doors: [door] });
    expect(performance.now() - started).toBeLessThan(200);
    expect(changes).toEqual([{ path: 'doors', label: 'Doors', from: '5,000 entries', to: '1 entry' }]);
    expect(diffPlans({ doors: [{ ...door, hinges: stored.doors[0].hinges }] }, { doors: [door] })).toEqual([
      { path: 'doors.0.hinges', label: 'Door 1, hinge positions', from: '100,000 entries', to: '2 entries' },
    ]);
  });
});
