import type { Facts } from '@/lib/domain/facts';
import { fittingEquivalentIn } from '@/lib/domain/facts';
import type { FittingKind, Plan, RunItem } from '@/lib/domain/plan';
import type { RuleSetParameters } from '@/lib/domain/params';
import { formatArea, formatLength, type UnitSystem } from '@/lib/domain/units';

export interface RemedyContext {
  plan: Plan;
  params: RuleSetParameters;
  facts: Facts;
  units: UnitSystem;
  measured: number | boolean | string | null;
  /** The limit as resolved for this plan; a range for min/max rules. */
  limit: number | boolean | string | { min: number; max: number } | null;
  failedCondition: string | null;
}

export type Remedy = (ctx: RemedyContext) => string | null;

const num = (value: unknown): number | null => (typeof value === 'number' && Number.isFinite(value) ? value : null);
const length = (ctx: RemedyContext, inches: number) => formatLength(inches, ctx.units);
const smallLength = (ctx: RemedyContext, inches: number) => formatLength(inches, ctx.units, 'inches');
const area = (ctx: RemedyContext, sqIn: number) => formatArea(sqIn, ctx.units);

/** Amount the measured value falls short of a minimum, or exceeds a maximum. */
function shortfall(ctx: RemedyContext): number | null {
  const m = num(ctx.measured);
  const l = num(ctx.limit);
  return m === null || l === null ? null : l - m;
}
function excess(ctx: RemedyContext): number | null {
  const s = shortfall(ctx);
  return s === null ? null : -s;
}

function byLength(template: (delta: string, ctx: RemedyContext) => string, direction: 'increase' | 'decrease', style: 'length' | 'small' = 'length'): Remedy {
  return (ctx) => {
    const delta = direction === 'increase' ? shortfall(ctx) : excess(ctx);
    if (delta === null || delta <= 0) return null;
    return template(style === 'small' ? smallLength(ctx, delta) : length(ctx, delta), ctx);
  };
}

const fixed = (text: string): Remedy => () => text;

const FITTING_NAMES: Record<FittingKind, string> = {
  mitered: '4-in-radius mitered',
  'smooth-6in': '6-in-radius smooth',
  'smooth-8in': '8-in-radius smooth',
  'smooth-10in': '10-in-radius smooth',
  other: 'unlisted (counted as 4-in-radius mitered)',
};

function describeFitting(item: RunItem): string {
  return `${FITTING_NAMES[item.fitting ?? 'other']} ${item.elbow}° elbow`;
}

/**
 * The smallest change that brings the developed length within the limit: remove the single
 * elbow whose equivalent just covers the excess, or shorten the straight runs by the excess;
 * failing both, swap mitered elbows for 6-in-radius smooth ones.
 */
export function shortenRoute(ctx: RemedyContext): string | null {
  const over = excess(ctx);
  if (over === null || over <= 0) return null;
  const run = ctx.plan.exhaust?.run ?? [];
  const straightTotal = run.reduce((sum, item) => sum + (item.straight ?? 0), 0);
  const options: string[] = [];

  const elbows = run
    .filter((item) => item.elbow !== undefined)
    .map((item) => ({ item, equivalent: fittingEquivalentIn(item, ctx.params) }))
    .filter(({ equivalent }) => equivalent >= over)
    .sort((a, b) => a.equivalent - b.equivalent);
  if (elbows.length > 0) {
    const { item, equivalent } = elbows[0];
    options.push(`remove one ${describeFitting(item)} (counts ${length(ctx, equivalent)})`);
  }
  if (straightTotal >= over) options.push(`shorten the straight run by ${length(ctx, over)}`);

  if (options.length === 0) {
    const mitered90 = run.filter((item) => item.elbow === 90 && !item.fitting?.startsWith('smooth'));
    const saving = ctx.params.exhaust.fittingEquivalentsIn['mitered-90'] - ctx.params.exhaust.fittingEquivalentsIn['smooth-6in-90'];
    const needed = saving > 0 ? Math.ceil(over / saving) : Infinity;
    if (needed <= mitered90.length) {
      options.push(`replace ${needed} mitered 90° elbow${needed > 1 ? 's' : ''} with 6-in-radius smooth ones`);
    } else {
      return `Reroute the exhaust: it is ${length(ctx, over)} over the limit, more than any one elbow or the straight runs can give back. A shorter path to an outside wall, or the dryer maker's longer allowance with its instructions given to the inspector, are the usual ways out.`;
    }
  }
  const text = options.join(', or ');
  return `${text.charAt(0).toUpperCase()}${text.slice(1)}.`;
}

function standpipe(ctx: RemedyContext): string | null {
  const m = num(ctx.measured);
  const range = ctx.limit;
  if (m === null || range === null || typeof range !== 'object') return null;
  if (m < range.min) return `Raise the standpipe by ${smallLength(ctx, range.min - m)} (to ${smallLength(ctx, range.min)} above the trap weir).`;
  if (m > range.max) return `Lower the standpipe by ${smallLength(ctx, m - range.max)} (to ${smallLength(ctx, range.max)} above the trap weir).`;
  return null;
}

function hingePositions(ctx: RemedyContext): string | null {
  const range = ctx.limit;
  if (range === null || typeof range !== 'object') return null;
  const nearest = num(ctx.facts['doors.hingeEdgeDistanceMinIn']);
  const farthest = num(ctx.facts['doors.hingeEdgeDistanceMaxIn']);
  const window = `${smallLength(ctx, range.min)} to ${smallLength(ctx, range.max)}`;
  if (nearest !== null && nearest < range.min) {
    return `Move the end hinge ${smallLength(ctx, range.min - nearest)} further from the door edge, so each end hinge sits ${window} from its end.`;
  }
  if (farthest !== null && farthest > range.max) {
    return `Move the end hinge ${smallLength(ctx, farthest - range.max)} closer to the door edge, so each end hinge sits ${window} from its end.`;
  }
  return null;
}

function makerVents(ctx: RemedyContext): string | null {
  const parts: string[] = [];
  const gap = (have: string, want: string) => {
    const h = num(ctx.facts[have]);
    const w = num(ctx.facts[want]);
    return h !== null && w !== null && w > h ? w - h : 0;
  };
  const top = gap('makeupAir.topOpeningAreaSqIn', 'makeupAir.makerTopSqIn');
  const bottom = gap('makeupAir.bottomOpeningAreaSqIn', 'makeupAir.makerBottomSqIn');
  if (top > 0) parts.push(`${area(ctx, top)} at the top`);
  if (bottom > 0) parts.push(`${area(ctx, bottom)} at the bottom`);
  if (parts.length === 0) return null;
  return `Add ${parts.join(' and ')} of net free vent area in the door, placed as the dryer maker shows.`;
}

/** Remedies by key; each returns the smallest change that passes, in the plan's units. */
export const remedies: Record<string, Remedy> = {
  'exhaust.shorten-route': shortenRoute,
  'exhaust.use-rigid-metal': fixed('Use rigid metal duct with a smooth interior from the transition connection to the terminal.'),
  'exhaust.use-nominal-diameter': (ctx) => `Use ${smallLength(ctx, num(ctx.limit) ?? 4)} nominal round duct, or follow the dryer maker's instructions if they allow another size.`,
  'exhaust.thicker-duct': (ctx) => `Use duct with a wall of at least ${formatLength(num(ctx.limit) ?? 0, ctx.units, 'decimal')}.`,
  'exhaust.shorten-transition': byLength((d, ctx) => `Shorten the transition duct by ${d}, to ${length(ctx, num(ctx.limit) ?? 0)} or less in one piece.`, 'decrease'),
  'exhaust.listed-transition': fixed('Replace the transition duct with one listed and labeled for dryer transition use.'),
  'exhaust.expose-transition': fixed('Bring the transition duct out of the wall or floor; run rigid duct inside the construction and connect the transition duct in the open.'),
  'exhaust.fasteners': byLength(
    (d, ctx) => `Cut fastener protrusion by ${d} (to at most ${smallLength(ctx, num(ctx.limit) ?? 0)}), or join sections with clamps or foil tape instead of screws.`,
    'decrease',
    'small',
  ),
  'exhaust.deeper-cavity': byLength((d) => `Give the duct a cavity at least ${d} deeper (a 2x6 wall gives 5-1/2 in, PS 20), or run it where it need not be concealed.`, 'increase', 'small'),
  'exhaust.add-length-label': fixed('Put a permanent label giving the concealed duct length within 6 ft of the dryer connection.'),
  'exhaust.move-termination': byLength((d) => `Move the terminal ${d} further from the opening, or check the dryer maker's instructions for their clearance.`, 'increase'),
  'exhaust.add-damper': fixed('Fit a terminal with a backdraft damper.'),
  'exhaust.remove-screen': fixed('Remove the screen, or use a terminal without one.'),
  'exhaust.terminate-outdoors': fixed('Extend the duct to a terminal outdoors, with a backdraft damper and no screen; never end it in an attic, soffit, crawl space, garage or other indoor space.'),
  'exhaust.larger-terminal': (ctx) => {
    const short = shortfall(ctx);
    const limit = num(ctx.limit);
    return short !== null && short > 0 && limit !== null
      ? `Use a terminal whose opening is at least ${area(ctx, limit)} (this one is ${area(ctx, short)} short).`
      : null;
  },
  'exhaust.add-supports': byLength((d, ctx) => `Add supports so none are more than ${length(ctx, num(ctx.limit) ?? 0)} apart (the widest gap is ${d} too long).`, 'decrease'),
  'exhaust.add-shield-plates': fixed('Fit steel shield plates at least 0.062 in thick over the duct where it is closer than 1-1/4 in to the framing face, extending 2 in above sole plates and below top plates; or move the duct back from the face.'),
  'exhaust.listed-power-ventilator': fixed('Replace the fan with a dryer exhaust duct power ventilator listed for the purpose, installed per its listing; or shorten the route so no fan is needed.'),
  'makeup-air.add-opening': (ctx) => {
    const s = shortfall(ctx);
    return s === null || s <= 0 ? null : `Add ${area(ctx, s)} of net free opening area to the closet (louvres or grilles), or provide make-up air by another approved means.`;
  },
  'makeup-air.maker-vents': makerVents,
  'makeup-air.provide-makeup-air': (ctx) => {
    const s = shortfall(ctx);
    return s === null || s <= 0 ? null : `Provide about ${Math.ceil(s)} cfm more make-up air.`;
  },
  'gas.relocate': (ctx) => {
    const fixes: Record<string, string> = {
      'space-not-dedicated': 'use the space for the appliances only (no storage)',
      'door-not-solid': 'fit a solid door',
      'door-not-weather-stripped': 'weather-strip the door all round',
      'door-not-self-closing': 'add an approved self-closing device to the door',
      'combustion-air-not-outdoors': 'take all combustion air from outdoors',
    };
    const fix = typeof ctx.measured === 'string' ? fixes[ctx.measured] : undefined;
    if (fix) return `To meet the exception, ${fix}; otherwise move the gas dryer out of the restricted space or use an electric dryer. Confirm with the AHJ.`;
    return 'Move the gas dryer out of the restricted space or use an electric dryer; ask the AHJ whether a direct-vent appliance or another exception fits this case.';
  },
  'gas.move-shutoff': (ctx) => {
    const over = excess(ctx);
    const move = over !== null && over > 0 ? ` ${length(ctx, over)} closer,` : '';
    return `Move the shut-off valve${move} into the same room and within ${length(ctx, num(ctx.limit) ?? 72)} of the dryer, where it can be reached.`;
  },
  'gas.shorten-connector': byLength((d, ctx) => `Shorten the appliance connector by ${d}, to ${length(ctx, num(ctx.limit) ?? 72)} or less; bring the piping closer instead.`, 'decrease'),
  'electrical.laundry-circuit': (ctx) => `Provide a dedicated ${num(ctx.limit) ?? 20} A branch circuit for the laundry receptacles.`,
  'electrical.move-receptacle': byLength((d) => `Move the receptacle ${d} closer to the appliance.`, 'decrease'),
  'electrical.receptacle-access': fixed('Place the receptacle where the plug can be reached with the appliance in place, e.g. beside the units rather than behind them.'),
  'electrical.add-gfci': fixed('Add GFCI protection (a GFCI breaker or device ahead of the receptacle).'),
  'electrical.add-afci': fixed('Add AFCI protection to the 120-V laundry circuit.'),
  'electrical.add-disconnect': fixed('Provide a disconnecting means for the hard-wired dryer: a switch or breaker within sight of it, or a breaker that can be locked in the open position.'),
  'electrical.four-wire': fixed('Run a 4-wire circuit (two hots, neutral and equipment ground) to a 4-wire dryer receptacle.'),
  'electrical.dryer-circuit': (ctx) => `Size the dryer circuit to the nameplate; ${num(ctx.limit) ?? 30} A is usual for an electric dryer.`,
  'plumbing.standpipe-height': standpipe,
  'plumbing.trap-size': (ctx) => `Use a trap of at least ${smallLength(ctx, num(ctx.limit) ?? 2)} for the washer.`,
  'plumbing.condensate-receptor': fixed('Lead the dryer’s drain hose to a standpipe, floor drain or indirect-waste receptor within the reach and height its maker allows (the washer standpipe often serves), or use the dryer’s reservoir where its maker provides one.'),
  'plumbing.drain-pan': fixed('Set the washer in a drain pan piped to an indirect-waste receptor or floor drain, as the local amendment describes.'),
  'plumbing.valve-access': fixed('Put the supply valves where they can be reached with the appliances in place, e.g. in a recessed washer box above the units.'),
  'plumbing.hammer-arrestors': fixed('Fit water-hammer arrestors at the washer supply valves.'),
  'plumbing.leak-shutoff': fixed('Install an automatic leak detector with a shut-off valve on the washer supply.'),
  'clearances.widen': byLength((d) => `Make the enclosure ${d} wider inside.`, 'increase'),
  'clearances.deepen': byLength((d) => `Make the enclosure ${d} deeper inside.`, 'increase'),
  'clearances.raise': byLength((d) => `Make the enclosure ${d} taller inside.`, 'increase'),
  'clearances.rear-zone': byLength((d) => `Add ${d} of depth behind the units (a deeper enclosure, or a recessed vent and outlet box).`, 'increase'),
  'service.widen-opening': byLength((d) => `Widen the clear opening by ${d}.`, 'increase'),
  'service.removable-toe-kick': fixed('Make the toe kick removable (clips or screws behind it), so the units slide straight out.'),
  'door-hardware.hinge-arm-room': byLength((d) => `Add ${d} of enclosure depth in front of the appliances, or use hinges whose arms stand less far behind the door.`, 'increase', 'small'),
  'door-hardware.add-hinges': (ctx) => {
    const s = shortfall(ctx);
    return s === null || s <= 0 ? null : `Add ${s} hinge${s > 1 ? 's' : ''} to the tallest door, spaced evenly between the end hinges.`;
  },
  'door-hardware.move-hinges': hingePositions,
  'door-hardware.door-swing': byLength((d) => `Gain ${d} of clear width with the doors open: wider opening, hinges that swing the leaves clear of the opening, or hinged doors instead of bypass doors.`, 'increase'),
};

export function computeRemedy(key: string | null, ctx: RemedyContext): string | null {
  if (!key) return null;
  const remedy = remedies[key];
  return remedy ? remedy(ctx) : null;
}
