import { define, type FactContext, type FactDefinition, type Need } from '@/lib/domain/facts/context';

export const makeupAirFactDefinitions: FactDefinition[] = [
  define('makeupAir.isCloset', 'boolean', 'The appliances stand in a closet or cabinet enclosure.', ['space.kind']),
  define('makeupAir.openingAreaSqIn', 'area', 'Total net free area of the openings into the closet.', ['makeupAir.openings']),
  define('makeupAir.topOpeningAreaSqIn', 'area', 'Net free area of openings at the top of the closet.', ['makeupAir.openings']),
  define('makeupAir.bottomOpeningAreaSqIn', 'area', 'Net free area of openings at the bottom of the closet.', ['makeupAir.openings']),
  define('makeupAir.makerVentGiven', 'boolean', 'The dryer maker gives closet-vent figures.', ['dryer.closetVent']),
  define('makeupAir.makerTopSqIn', 'area', 'Top closet-vent area the dryer maker asks for.', ['dryer.closetVent.top']),
  define('makeupAir.makerBottomSqIn', 'area', 'Bottom closet-vent area the dryer maker asks for.', ['dryer.closetVent.bottom']),
  define('makeupAir.exhaustCfm', 'cfm', 'Exhaust rate of the dryer.', ['dryer.exhaustCfm']),
  define('makeupAir.providedCfm', 'cfm', 'Make-up air supplied by other means.', ['makeupAir.providedCfm']),
];

const CLOSETS = new Set(['reach-in-closet', 'walk-in-closet', 'hall-closet', 'storage-closet', 'cabinet']);

export function computeMakeupAirFacts(ctx: FactContext): void {
  const { plan } = ctx;
  const openings = plan.makeupAir?.openings;

  ctx.fact('makeupAir.isCloset', (need) => CLOSETS.has(need('space.kind', plan.space?.kind)));
  const sumWhere = (position?: string) => (need: Need) =>
    need('makeupAir.openings', openings).reduce((sum, opening, index) => {
      if (position !== undefined && need(`makeupAir.openings.${index}.position`, opening.position) !== position) return sum;
      return sum + need(`makeupAir.openings.${index}.netFreeArea`, opening.netFreeArea);
    }, 0);
  ctx.fact('makeupAir.openingAreaSqIn', sumWhere());
  ctx.fact('makeupAir.topOpeningAreaSqIn', sumWhere('top'));
  ctx.fact('makeupAir.bottomOpeningAreaSqIn', sumWhere('bottom'));

  const vent = plan.dryer?.closetVent;
  ctx.fact('makeupAir.makerVentGiven', (need) => need('dryer.closetVent', vent === null ? false : vent) !== false);
  ctx.fact('makeupAir.makerTopSqIn', (need) => need('dryer.closetVent.top', vent?.top));
  ctx.fact('makeupAir.makerBottomSqIn', (need) => need('dryer.closetVent.bottom', vent?.bottom));
  ctx.fact('makeupAir.exhaustCfm', (need) => need('dryer.exhaustCfm', plan.dryer?.exhaustCfm));
  ctx.fact('makeupAir.providedCfm', (need) => need('makeupAir.providedCfm', plan.makeupAir?.providedCfm));
}
