import { entryAt } from '@/lib/domain/plan/registry';
import { inchesToMm, sqInToCm2, type UnitSystem } from '@/lib/domain/units';
import type { ApplianceModel } from '@/lib/domain/appliances/model';

/** One editor value a picked model sets: the plan path and the text the form holds there. */
export interface FilledValue {
  path: string;
  value: string;
}

const trim = (n: number, places: number) => n.toFixed(places).replace(/\.?0+$/, '');

/** A length as the form holds it: a bare number in the plan's units (inches, or millimetres to 0.1). */
function lengthText(inches: number | null, units: UnitSystem): string {
  if (inches === null) return '';
  return units === 'metric' ? trim(inchesToMm(inches), 1) : trim(inches, 4);
}

function areaText(sqIn: number | null, units: UnitSystem): string {
  if (sqIn === null) return '';
  return units === 'metric' ? trim(sqInToCm2(sqIn), 1) : trim(sqIn, 2);
}

/** A receptacle as the editor holds it: what it serves decides whether a model's rating goes there. */
export interface ReceptacleSlot {
  serves?: unknown;
}

/**
 * The editor values a library model fills into the washer or dryer slot of a plan, in the plan's units.
 * Figures the model lacks are cleared, so nothing of a previously picked model lingers; the installer can
 * still edit every value. Fields the plan does not have (yet) are skipped.
 *
 * The model's electrical rating goes to the receptacles that serve this slot (a combination unit's also to
 * those serving both). A receptacle is there whatever model is picked, so a model without a rating leaves its
 * volts and amps as they are.
 */
export function filledValues(
  model: Pick<ApplianceModel, keyof ApplianceModel>,
  slot: 'washer' | 'dryer',
  units: UnitSystem,
  receptacles: ReadonlyArray<ReceptacleSlot | null | undefined> = [],
): FilledValue[] {
  const L = (v: number | null) => lengthText(v, units);
  const values: FilledValue[] = [
    { path: `${slot}.model.id`, value: model.id },
    { path: `${slot}.model.label`, value: model.label },
    { path: `${slot}.width`, value: L(model.widthIn) },
    { path: `${slot}.depth`, value: L(model.depthIn) },
    { path: `${slot}.height`, value: L(model.heightIn) },
    { path: `${slot}.frontProjection`, value: L(model.frontProjectionIn) },
    { path: `${slot}.clearances.side`, value: L(model.clearanceSideIn) },
    { path: `${slot}.clearances.top`, value: L(model.clearanceTopIn) },
    { path: `${slot}.clearances.rear`, value: L(model.clearanceRearIn) },
    { path: `${slot}.clearances.front`, value: L(model.clearanceFrontIn) },
  ];
  if (slot === 'dryer') {
    const vent = model.closetVentTopSqIn !== null || model.closetVentBottomSqIn !== null;
    values.push(
      { path: 'dryer.fuel', value: model.fuel ?? '' },
      { path: 'dryer.type', value: model.dryerType ?? '' },
      { path: 'dryer.exhaustCfm', value: model.exhaustCfm === null ? '' : trim(model.exhaustCfm, 2) },
      { path: 'dryer.maxDuctLength', value: L(model.maxExhaustLengthIn) },
      { path: '_has.dryer_closetVent', value: vent ? 'present' : '' },
      { path: 'dryer.closetVent.top', value: areaText(model.closetVentTopSqIn, units) },
      { path: 'dryer.closetVent.bottom', value: areaText(model.closetVentBottomSqIn, units) },
    );
  }
  receptacles.forEach((r, i) => {
    const serves = r?.serves;
    if (serves !== slot && !(serves === 'both' && model.kind === 'washer-dryer')) return;
    if (model.volts !== null) values.push({ path: `electrical.receptacles.${i}.volts`, value: trim(model.volts, 2) });
    if (model.amps !== null) values.push({ path: `electrical.receptacles.${i}.amps`, value: trim(model.amps, 2) });
  });
  return values.filter((v) => v.path.startsWith('_has.') || entryAt(v.path) !== undefined);
}
