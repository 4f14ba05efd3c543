import type { Appliance, Plan } from '@/lib/domain/plan';
import { define, type FactContext, type FactDefinition, type Need } from '@/lib/domain/facts/context';
import { insetDepthIn } from '@/lib/domain/facts/door-details';

export const clearanceFactDefinitions: FactDefinition[] = [
  define('clearances.insideWidthIn', 'length', 'Inside width of the enclosure (outside width less two side panels when measured outside).', ['enclosure.width', 'enclosure.depthMeasured', 'enclosure.panelThickness']),
  define('clearances.insideDepthIn', 'length', 'Inside depth of the enclosure, back panel to the closed doors (an inset door closes inside a depth measured inside).', ['enclosure.depth', 'enclosure.depthMeasured', 'enclosure.panelThickness', 'doors']),
  define('clearances.insideHeightIn', 'length', 'Inside height of the enclosure, floor to the top panel.', ['enclosure.height', 'enclosure.depthMeasured', 'enclosure.panelThickness']),
  define('clearances.requiredWidthIn', 'length', 'Width the units need with the maker’s side clearances.', ['arrangement', 'washer.width', 'dryer.width', 'washer.clearances.side', 'dryer.clearances.side']),
  define('clearances.requiredDepthIn', 'length', 'Depth the units need: cabinet, knobs and door, and the maker’s front and rear clearances.', ['washer.depth', 'dryer.depth', 'washer.frontProjection', 'dryer.frontProjection', 'washer.clearances.front', 'washer.clearances.rear', 'dryer.clearances.front', 'dryer.clearances.rear']),
  define('clearances.requiredHeightIn', 'length', 'Height the units need with the maker’s top clearance.', ['arrangement', 'washer.height', 'dryer.height', 'washer.clearances.top', 'dryer.clearances.top']),
  define('fit.unitsWidthIn', 'length', 'Width the units themselves take for the arrangement, without clearances.', ['arrangement', 'washer.width', 'dryer.width']),
  define('fit.unitsDepthIn', 'length', 'Depth the deeper unit takes, cabinet plus knobs and door where given, without clearances.', ['washer.depth', 'dryer.depth', 'washer.frontProjection', 'dryer.frontProjection']),
  define('fit.unitsHeightIn', 'length', 'Height the units themselves take for the arrangement, without clearances.', ['arrangement', 'washer.height', 'dryer.height']),
  define('clearances.rearZoneIn', 'length', 'Space left behind the deeper unit once its front clearance is kept.', ['enclosure.depth', 'washer.depth', 'dryer.depth', 'washer.frontProjection', 'dryer.frontProjection']),
  define('clearances.rearZoneRequiredIn', 'length', 'Rear zone wanted: the larger of the common-practice figure and the maker’s rear clearance.', ['washer.clearances.rear', 'dryer.clearances.rear']),
];


/** Thickness allowed for the closed doors in an outside depth: the thickest door, else one panel. */
function doorAllowance(plan: Plan, panel: number): number {
  const doors = plan.doors;
  if (doors === undefined) return panel;
  return doors.reduce((max, door) => Math.max(max, door.thickness ?? panel), 0);
}

export function insideDimension(plan: Plan, need: Need, dimension: 'width' | 'depth' | 'height'): number {
  const enclosure = plan.enclosure;
  const measured = need(`enclosure.${dimension}`, enclosure?.[dimension]);
  const how = need('enclosure.depthMeasured', enclosure?.depthMeasured);
  // An inside depth runs to the panels' front edges; an inset door closes within it, by its own thickness.
  if (how === 'inside') return dimension === 'depth' ? measured - insetDepthIn(plan.doors, (door, i) => need(`doors.${i}.thickness`, door.thickness)) : measured;
  const panel = need('enclosure.panelThickness', enclosure?.panelThickness);
  if (dimension === 'width') return measured - 2 * panel;
  if (dimension === 'depth') return measured - panel - doorAllowance(plan, panel);
  return measured - panel;
}

export function units(plan: Plan): Array<['washer' | 'dryer', Appliance | undefined]> {
  return [
    ['washer', plan.washer],
    ['dryer', plan.dryer],
  ];
}

/** Cabinet depth plus knobs and door: how far the unit reaches forward from its back. */
export function overallDepth(need: Need, name: 'washer' | 'dryer', unit: Appliance | undefined): number {
  return need(`${name}.depth`, unit?.depth) + need(`${name}.frontProjection`, unit?.frontProjection);
}

export function computeClearanceFacts(ctx: FactContext): void {
  const { plan, params } = ctx;
  ctx.fact('clearances.insideWidthIn', (need) => insideDimension(plan, need, 'width'));
  ctx.fact('clearances.insideDepthIn', (need) => insideDimension(plan, need, 'depth'));
  ctx.fact('clearances.insideHeightIn', (need) => insideDimension(plan, need, 'height'));

  ctx.fact('clearances.requiredWidthIn', (need) => {
    const arrangement = need('arrangement', plan.arrangement);
    const [w, d] = units(plan).map(([name, unit]) => ({
      width: need(`${name}.width`, unit?.width),
      side: need(`${name}.clearances.side`, unit?.clearances?.side),
    }));
    if (arrangement === 'stacked') return Math.max(w.width + 2 * w.side, d.width + 2 * d.side);
    // Side by side: each outer side plus one shared gap between the units (the larger asked for).
    return w.width + d.width + w.side + d.side + Math.max(w.side, d.side);
  });
  ctx.fact('clearances.requiredDepthIn', (need) =>
    Math.max(
      ...units(plan).map(
        ([name, unit]) =>
          overallDepth(need, name, unit) +
          need(`${name}.clearances.front`, unit?.clearances?.front) +
          need(`${name}.clearances.rear`, unit?.clearances?.rear),
      ),
    ),
  );
  ctx.fact('clearances.requiredHeightIn', (need) => {
    const arrangement = need('arrangement', plan.arrangement);
    const [w, d] = units(plan).map(([name, unit]) => ({
      height: need(`${name}.height`, unit?.height),
      top: need(`${name}.clearances.top`, unit?.clearances?.top),
    }));
    if (arrangement === 'stacked') return w.height + d.height + d.top;
    return Math.max(w.height + w.top, d.height + d.top);
  });
  // The units alone, without the maker's clearances: an enclosure smaller than this cannot be built as
  // drawn. A front projection is counted where given; a missing one is asked for by the clearance rules.
  ctx.fact('fit.unitsWidthIn', (need) => {
    const arrangement = need('arrangement', plan.arrangement);
    const [w, d] = units(plan).map(([name, unit]) => need(`${name}.width`, unit?.width));
    return arrangement === 'stacked' ? Math.max(w, d) : w + d;
  });
  ctx.fact('fit.unitsDepthIn', (need) =>
    Math.max(...units(plan).map(([name, unit]) => need(`${name}.depth`, unit?.depth) + (unit?.frontProjection ?? 0))),
  );
  ctx.fact('fit.unitsHeightIn', (need) => {
    const arrangement = need('arrangement', plan.arrangement);
    const [w, d] = units(plan).map(([name, unit]) => need(`${name}.height`, unit?.height));
    return arrangement === 'stacked' ? w + d : Math.max(w, d);
  });
  ctx.fact('clearances.rearZoneIn', (need) => {
    const inside = insideDimension(plan, need, 'depth');
    const forward = Math.max(
      ...units(plan).map(([name, unit]) => overallDepth(need, name, unit) + (unit?.clearances?.front ?? 0)),
    );
    return inside - forward;
  });
  ctx.fact('clearances.rearZoneRequiredIn', () =>
    Math.max(params.service.rearZoneMinIn, ...units(plan).map(([, unit]) => unit?.clearances?.rear ?? 0)),
  );
}
