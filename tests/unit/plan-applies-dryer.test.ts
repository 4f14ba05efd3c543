import { describe, expect, it } from 'vitest';
import { formToPlan, planToForm } from '@/components/plan-editor/form-values';
import { editorSections, fieldApplies, parsePlan } from '@/lib/domain/plan';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { variant, type LoosePlan } from './support/check';

const roundTrip = (plan: unknown): LoosePlan => formToPlan(planToForm(plan as never));

describe('dryer type, condensate and exhaust fields in the editor', () => {
  it('a vented dryer (or one whose type is blank) is asked for its exhaust, never for condensate', () => {
    const blank = roundTrip(variant((p) => Object.assign(p.dryer, { condensate: 'drain', condensateDrainTo: 'standpipe' })));
    expect(blank.exhaust.run).toHaveLength(hallClosetPassPlan.exhaust.run.length);
    expect(blank.exhaust.termination.location).toBe('outdoors');
    expect(blank.dryer.exhaustCfm).toBe(160);
    expect(blank.dryer.condensate).toBeUndefined();
    expect(blank.dryer.condensateDrainTo).toBeUndefined();
    expect(fieldApplies({ dryer: { type: 'vented' } }, 'exhaust.run.0.straight')).toBe(true);
  });

  it.each(['condensing', 'heat-pump'])('a %s dryer is not asked for an exhaust route; its condensate is asked', (type) => {
    const plan = roundTrip(
      variant((p) => Object.assign(p.dryer, { type, condensate: 'drain', condensateDrainTo: 'standpipe', condensateDrainReachable: true })),
    );
    expect(plan.exhaust).toBeUndefined();
    expect(plan.dryer.exhaustCfm).toBeUndefined();
    expect(plan.dryer.maxDuctLength).toBeUndefined();
    expect(roundTrip(variant((p) => Object.assign(p.dryer, { type }, (p.makeupAir.providedCfm = 200) && {}))).makeupAir.providedCfm).toBeUndefined();
    expect(plan.dryer).toMatchObject({ type, condensate: 'drain', condensateDrainTo: 'standpipe', condensateDrainReachable: true });
    // The maker's closet figures still apply to a ventless dryer.
    expect(plan.dryer.clearances).toEqual(hallClosetPassPlan.dryer.clearances);
    expect(parsePlan(plan).ok).toBe(true);
    // The route builder is hidden with its section.
    const exhaust = editorSections.find((s) => s.id === 'exhaust')!;
    expect(exhaust.lists.some((l) => l.path === 'exhaust.run')).toBe(true);
    expect(fieldApplies({ dryer: { type } }, 'exhaust.run')).toBe(false);
  });

  it('the drain destination is asked only where the maker calls for a drain; its reach only where it goes somewhere', () => {
    const reservoir = roundTrip(variant((p) => Object.assign(p.dryer, { type: 'condensing', condensate: 'reservoir', condensateDrainTo: 'standpipe' })));
    expect(reservoir.dryer.condensateDrainTo).toBeUndefined();
    const nowhere = roundTrip(
      variant((p) => Object.assign(p.dryer, { type: 'condensing', condensate: 'drain', condensateDrainTo: 'none', condensateDrainReachable: true })),
    );
    expect(nowhere.dryer.condensateDrainTo).toBe('none');
    expect(nowhere.dryer.condensateDrainReachable).toBeUndefined();
  });

  it('cavity depth, framing-face distance and shield plates only for a concealed duct; fastener protrusion only when fasteners go in', () => {
    const exposed = roundTrip(variant((p) => Object.assign(p.exhaust, { concealed: false, shieldPlates: true })));
    expect(exposed.exhaust.cavityDepth).toBeUndefined();
    expect(exposed.exhaust.framingFaceClearance).toBeUndefined();
    expect(exposed.exhaust.shieldPlates).toBeUndefined();
    const concealed = roundTrip(variant((p) => (p.exhaust.fastenerProtrusion = '1/8')));
    expect(concealed.exhaust).toMatchObject({ cavityDepth: '5-1/2', framingFaceClearance: '1-1/4', shieldPlates: false });
    expect(concealed.exhaust.fastenerProtrusion).toBeUndefined();
  });

  it('hard-wired and its disconnect only on the dryer’s entry; a hard-wired dryer is not asked for plug reach or distance', () => {
    const plan = roundTrip(
      variant((p) => {
        p.electrical.receptacles[0].hardWired = true;
        Object.assign(p.electrical.receptacles[1], { hardWired: true, disconnect: 'within-sight' });
      }),
    );
    const [washer, dryer] = plan.electrical.receptacles;
    expect(washer.hardWired).toBeUndefined();
    expect(washer.reachableInstalled).toBe(true);
    expect(dryer).toMatchObject({ hardWired: true, disconnect: 'within-sight' });
    expect(dryer.reachableInstalled).toBeUndefined();
    expect(dryer.distanceToAppliance).toBeUndefined();
    const plugged = roundTrip(variant((p) => (p.electrical.receptacles[1].disconnect = 'within-sight')));
    expect(plugged.electrical.receptacles[1].disconnect).toBeUndefined();
    expect(plugged.electrical.receptacles[1].reachableInstalled).toBe(true);
  });
});
