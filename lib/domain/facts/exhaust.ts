import type { FittingKind, RunItem } from '@/lib/domain/plan';
import type { FittingEquivalentKey, RuleSetParameters } from '@/lib/domain/params';
import { define, nominalSizeIn, type FactContext, type FactDefinition } from '@/lib/domain/facts/context';

export const exhaustFactDefinitions: FactDefinition[] = [
  define('exhaust.ductRequired', 'boolean', 'The dryer needs an exhaust duct: it is vented (the default), not a listed condensing or heat-pump dryer.', ['dryer.type']),
  define('exhaust.developedLengthIn', 'length', 'Developed length of the exhaust duct: straight runs plus each elbow at its table equivalent; the transition duct not counted.', ['exhaust.run']),
  define('exhaust.allowedLengthIn', 'length', 'Longest developed length allowed: the code maximum, or the maker’s or power ventilator’s maximum where allowed.', ['dryer.maxDuctLength', 'exhaust.boosterFan.maxDuctLength']),
  define('exhaust.allowedLengthSource', 'text', 'Where the allowed length comes from.', ['dryer.maxDuctLength'], ['code', 'manufacturer', 'power-ventilator']),
  define('exhaust.material', 'text', 'Material of the exhaust duct.', ['exhaust.material'], ['rigid-metal', 'semi-rigid-metal', 'flexible-foil', 'flexible-vinyl', 'other']),
  define('exhaust.diameterNominalIn', 'length', 'Nominal diameter of the exhaust duct.', ['exhaust.diameter']),
  define('exhaust.thicknessIn', 'length', 'Wall thickness of the exhaust duct.', ['exhaust.thickness']),
  define('exhaust.transitionLengthIn', 'length', 'Length of the transition duct.', ['exhaust.transition.length']),
  define('exhaust.transitionListed', 'boolean', 'The transition duct is listed and labeled.', ['exhaust.transition.listed']),
  define('exhaust.transitionConcealed', 'boolean', 'The transition duct is concealed in construction.', ['exhaust.transition.concealed']),
  define('exhaust.fastenerProtrusionIn', 'length', 'How far fasteners stand into the airstream (0 when none penetrate).', ['exhaust.fastenersIntoAirstream', 'exhaust.fastenerProtrusion']),
  define('exhaust.concealed', 'boolean', 'Part of the exhaust duct is concealed.', ['exhaust.concealed']),
  define('exhaust.cavityDepthIn', 'length', 'Depth of the cavity the concealed duct runs in.', ['exhaust.cavityDepth']),
  define('exhaust.ductOutsideIn', 'length', 'Outside size of the round duct (diameter plus two walls).', ['exhaust.diameter']),
  define('exhaust.lengthLabelRequired', 'boolean', 'A concealed-duct length label is required under the adopted edition.', ['exhaust.concealed', 'exhaust.run']),
  define('exhaust.lengthLabel', 'boolean', 'A length label is installed.', ['exhaust.lengthLabel']),
  define('exhaust.terminationClearanceIn', 'length', 'Distance from the terminal to the nearest opening into the building.', ['exhaust.termination.clearanceToOpenings']),
  define('exhaust.backdraftDamper', 'boolean', 'The terminal has a backdraft damper.', ['exhaust.termination.backdraftDamper']),
  define('exhaust.screen', 'boolean', 'The terminal has a screen.', ['exhaust.termination.screen']),
  define('exhaust.terminationLocation', 'text', 'Where the exhaust duct ends.', ['exhaust.termination.location'], ['outdoors', 'attic', 'crawl-space', 'soffit', 'garage', 'other-indoor']),
  define('exhaust.terminalOpeningSqIn', 'area', 'Free area of the terminal’s opening.', ['exhaust.termination.openingArea']),
  define('exhaust.supportSpacingIn', 'length', 'Greatest distance between duct supports.', ['exhaust.supportSpacing']),
  define('exhaust.framingFaceClearanceIn', 'length', 'Least distance from the concealed duct to the framing face.', ['exhaust.framingFaceClearance']),
  define('exhaust.shieldPlates', 'boolean', 'Shield plates protect the duct (asked only where it is closer to the framing face than the minimum).', ['exhaust.framingFaceClearance', 'exhaust.shieldPlates']),
  define('exhaust.boosterFanPresent', 'boolean', 'A fan is added to the exhaust duct.', ['exhaust.boosterFan']),
  define('exhaust.boosterFanListed', 'boolean', 'The added fan is listed for dryer exhaust.', ['exhaust.boosterFan.listed']),
  define('exhaust.boosterFanKind', 'text', 'Kind of added fan.', ['exhaust.boosterFan.kind'], ['power-ventilator', 'booster']),
];

function fittingKey(kind: FittingKind | undefined, angle: 45 | 90): FittingEquivalentKey {
  // Fittings outside the table count as 4-in radius mitered: conservative, common practice.
  const family = kind === undefined || kind === 'other' ? 'mitered' : kind;
  return `${family}-${angle}` as FittingEquivalentKey;
}

export function fittingEquivalentIn(item: RunItem, params: RuleSetParameters): number {
  if (item.elbow === undefined) return 0;
  return params.exhaust.fittingEquivalentsIn[fittingKey(item.fitting, item.elbow)];
}

export function computeExhaustFacts(ctx: FactContext): void {
  const { plan, params } = ctx;
  const exhaust = plan.exhaust;

  // A dryer whose type is not given is taken as vented, the usual kind.
  ctx.fact('exhaust.ductRequired', () => (plan.dryer?.type ?? 'vented') === 'vented');

  ctx.fact('exhaust.developedLengthIn', (need) => {
    const run = need('exhaust.run', exhaust?.run && exhaust.run.length > 0 ? exhaust.run : undefined);
    return run.reduce((sum, item) => sum + (item.straight ?? 0) + fittingEquivalentIn(item, params), 0);
  });

  const maker = plan.dryer?.maxDuctLength;
  const fan = exhaust?.boosterFan;
  const fanLength = fan && fan.kind === 'power-ventilator' && fan.listed ? fan.maxDuctLength : undefined;
  let allowed = params.exhaust.maxDevelopedLengthIn;
  let source = 'code';
  if (fanLength !== undefined) {
    // IRC 2018 M1502.4.5.3: with a listed power ventilator the length follows its instructions.
    allowed = fanLength;
    source = 'power-ventilator';
  } else if (params.exhaust.allowManufacturerLength && maker !== undefined && maker !== null) {
    allowed = maker;
    source = 'manufacturer';
  }
  ctx.fact('exhaust.allowedLengthIn', () => allowed);
  ctx.fact('exhaust.allowedLengthSource', () => source);

  ctx.fact('exhaust.material', (need) => need('exhaust.material', exhaust?.material));
  ctx.fact('exhaust.diameterNominalIn', (need) => nominalSizeIn(need('exhaust.diameter', exhaust?.diameter)));
  ctx.fact('exhaust.thicknessIn', (need) => need('exhaust.thickness', exhaust?.thickness));
  ctx.fact('exhaust.transitionLengthIn', (need) => need('exhaust.transition.length', exhaust?.transition?.length));
  ctx.fact('exhaust.transitionListed', (need) => need('exhaust.transition.listed', exhaust?.transition?.listed));
  ctx.fact('exhaust.transitionConcealed', (need) => need('exhaust.transition.concealed', exhaust?.transition?.concealed));
  ctx.fact('exhaust.fastenerProtrusionIn', (need) => {
    const penetrates = need('exhaust.fastenersIntoAirstream', exhaust?.fastenersIntoAirstream);
    return penetrates ? need('exhaust.fastenerProtrusion', exhaust?.fastenerProtrusion) : 0;
  });
  ctx.fact('exhaust.concealed', (need) => need('exhaust.concealed', exhaust?.concealed));
  ctx.fact('exhaust.cavityDepthIn', (need) => need('exhaust.cavityDepth', exhaust?.cavityDepth));
  ctx.fact('exhaust.ductOutsideIn', (need) => {
    const diameter = need('exhaust.diameter', exhaust?.diameter);
    return diameter + 2 * (exhaust?.thickness ?? params.exhaust.minDuctThicknessIn);
  });

  const trigger = params.exhaust.lengthLabelTrigger;
  if (trigger === 'never') ctx.fact('exhaust.lengthLabelRequired', () => false);
  else if (trigger === 'concealed') ctx.derived('exhaust.lengthLabelRequired', ['exhaust.concealed'], (c) => c === true);
  else {
    ctx.derived(
      'exhaust.lengthLabelRequired',
      ['exhaust.developedLengthIn'],
      (length) => (length as number) > params.exhaust.maxDevelopedLengthIn,
    );
  }
  ctx.fact('exhaust.lengthLabel', (need) => need('exhaust.lengthLabel', exhaust?.lengthLabel));

  const termination = exhaust?.termination;
  ctx.fact('exhaust.terminationClearanceIn', (need) => need('exhaust.termination.clearanceToOpenings', termination?.clearanceToOpenings));
  ctx.fact('exhaust.backdraftDamper', (need) => need('exhaust.termination.backdraftDamper', termination?.backdraftDamper));
  ctx.fact('exhaust.screen', (need) => need('exhaust.termination.screen', termination?.screen));
  ctx.fact('exhaust.terminationLocation', (need) => need('exhaust.termination.location', termination?.location));
  ctx.fact('exhaust.terminalOpeningSqIn', (need) => need('exhaust.termination.openingArea', termination?.openingArea));
  ctx.fact('exhaust.supportSpacingIn', (need) => need('exhaust.supportSpacing', exhaust?.supportSpacing));
  ctx.fact('exhaust.framingFaceClearanceIn', (need) => need('exhaust.framingFaceClearance', exhaust?.framingFaceClearance));
  // Plates are only asked about where the duct is closer to the framing face than the minimum.
  ctx.fact('exhaust.shieldPlates', (need) => {
    const clearance = need('exhaust.framingFaceClearance', exhaust?.framingFaceClearance);
    if (clearance >= params.exhaust.shieldPlateMinClearanceIn) return exhaust?.shieldPlates ?? false;
    return need('exhaust.shieldPlates', exhaust?.shieldPlates);
  });

  // null means "no fan"; a missing field means the installer has not said.
  ctx.fact('exhaust.boosterFanPresent', (need) => need('exhaust.boosterFan', exhaust?.boosterFan === null ? false : exhaust?.boosterFan) !== false);
  ctx.fact('exhaust.boosterFanListed', (need) => need('exhaust.boosterFan.listed', fan?.listed));
  ctx.fact('exhaust.boosterFanKind', (need) => need('exhaust.boosterFan.kind', fan?.kind));
}
