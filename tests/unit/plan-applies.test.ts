import { describe, expect, it } from 'vitest';
import { formToPlan, isShown, planToForm } from '@/components/plan-editor/form-values';
import { conditionHolds, conditionsAt, editorSections, fieldApplies, registryEntries } from '@/lib/domain/plan';

const spaceField = (path: string) => editorSections.find((s) => s.id === 'space')!.fields.find((f) => f.path === path)!;

describe('fields shown only when they apply', () => {
  it('reads equals, in, notIn (blank counts as the default), all and any', () => {
    const plan = { dryer: { fuel: 'gas' }, electrical: { receptacles: [{ serves: 'washer' }, { serves: 'dryer' }] } };
    expect(conditionHolds({ path: 'dryer.fuel', equals: 'gas' }, plan)).toBe(true);
    expect(conditionHolds({ path: 'dryer.fuel', equals: 'electric' }, plan)).toBe(false);
    expect(conditionHolds({ path: 'dryer.fuel', in: ['electric', 'gas'] }, plan)).toBe(true);
    expect(conditionHolds({ path: 'dryer.fuel', in: ['gas'] }, {})).toBe(false);
    expect(conditionHolds({ path: 'dryer.fuel', notIn: ['gas'] }, plan)).toBe(false);
    expect(conditionHolds({ path: 'dryer.fuel', notIn: ['gas'] }, {})).toBe(true);
    expect(conditionHolds({ all: [{ path: 'dryer.fuel', equals: 'gas' }, { path: 'units', equals: 'metric' }] }, plan)).toBe(false);
    expect(conditionHolds({ any: [{ path: 'dryer.fuel', equals: 'gas' }, { path: 'units', equals: 'metric' }] }, plan)).toBe(true);
    // A `*` is the field's own list item.
    const servesDryer = { path: 'electrical.receptacles.*.serves', equals: 'dryer' } as const;
    expect(conditionHolds(servesDryer, plan, 'electrical.receptacles.0.gfci')).toBe(false);
    expect(conditionHolds(servesDryer, plan, 'electrical.receptacles.1.gfci')).toBe(true);
  });

  it('applies a group’s condition to every field it holds', () => {
    expect(conditionsAt('space.door.solid')).toHaveLength(1);
    expect(fieldApplies({ dryer: { fuel: 'gas' } }, 'space.door.solid')).toBe(true);
    expect(fieldApplies({ dryer: { fuel: 'electric' } }, 'space.door.solid')).toBe(false);
    expect(fieldApplies({}, 'space.door.solid')).toBe(false);
    // Fields without conditions always apply.
    expect(conditionsAt('enclosure.width')).toHaveLength(0);
    expect(fieldApplies({}, 'enclosure.width')).toBe(true);
  });

  it('names only fields the plan has in its conditions', () => {
    const paths = new Set(registryEntries.map((e) => e.path));
    for (const { path } of registryEntries) {
      for (const c of conditionsAt(path)) if ('path' in c) expect(paths.has(c.path), `${path} → ${c.path}`).toBe(true);
    }
  });

  it('shows the gas-location fields in the editor only for a gas dryer, and never saves them while hidden', () => {
    const spec = spaceField('space.door.solid');
    expect(spec.appliesPath).toBe('space.door.solid');
    expect(spaceField('space.kind').appliesPath).toBeUndefined();

    const values = planToForm({ units: 'imperial', dryer: { fuel: 'gas' }, space: { kind: 'laundry-room', door: { solid: true }, dedicatedToLaundry: true } });
    expect(values.space.door.solid).toBe('yes');
    let plan = formToPlan(values);
    expect(isShown(spec, plan, 'space.door.solid')).toBe(true);
    expect(plan.space).toEqual({ kind: 'laundry-room', door: { solid: true }, dedicatedToLaundry: true });

    values.dryer.fuel = 'electric';
    plan = formToPlan(values);
    expect(isShown(spec, plan, 'space.door.solid')).toBe(false);
    expect(plan.space).toEqual({ kind: 'laundry-room' });
    expect(plan.gas).toBeNull();
  });
});
