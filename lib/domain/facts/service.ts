import { define, type FactContext, type FactDefinition } from '@/lib/domain/facts/context';
import { insideDimension } from '@/lib/domain/facts/clearances';

export const serviceFactDefinitions: FactDefinition[] = [
  define('service.openingWidthIn', 'length', 'Clear width of the enclosure opening (the inside width unless a face frame narrows it).', ['enclosure.openingWidth', 'enclosure.width']),
  define('service.widestUnitIn', 'length', 'Width of the wider unit: an opening narrower than this keeps it in.', ['washer.width', 'dryer.width']),
  define('service.removalWidthRequiredIn', 'length', 'Opening width needed to take the widest unit out: its width plus the service margin.', ['washer.width', 'dryer.width']),
  define('service.toeKickPresent', 'boolean', 'A toe kick or sill crosses the bottom of the opening.', ['enclosure.toeKick']),
  define('service.toeKickRemovable', 'boolean', 'The toe kick comes off for removal.', ['enclosure.toeKick.removable']),
];

export function computeServiceFacts(ctx: FactContext): void {
  const { plan, params } = ctx;
  const enclosure = plan.enclosure;
  ctx.fact('service.openingWidthIn', (need) => enclosure?.openingWidth ?? insideDimension(plan, need, 'width'));
  ctx.fact('service.widestUnitIn', (need) => Math.max(need('washer.width', plan.washer?.width), need('dryer.width', plan.dryer?.width)));
  ctx.fact('service.removalWidthRequiredIn', (need) =>
    Math.max(need('washer.width', plan.washer?.width), need('dryer.width', plan.dryer?.width)) + params.service.removalMarginIn,
  );
  // null means no toe kick; a missing field means the installer has not said.
  ctx.fact('service.toeKickPresent', (need) => {
    const toeKick = need('enclosure.toeKick', enclosure?.toeKick === null ? false : enclosure?.toeKick);
    return toeKick !== false && need('enclosure.toeKick.height', toeKick.height) > 0;
  });
  ctx.fact('service.toeKickRemovable', (need) => need('enclosure.toeKick.removable', enclosure?.toeKick?.removable));
}
