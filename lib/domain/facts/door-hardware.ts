import type { Door, Plan } from '@/lib/domain/plan';
import type { RuleSetParameters } from '@/lib/domain/params';
import { define, type FactContext, type FactDefinition, type Need } from '@/lib/domain/facts/context';
import { insideDimension, overallDepth, units } from '@/lib/domain/facts/clearances';

export const doorHardwareFactDefinitions: FactDefinition[] = [
  define('doors.hingedDoorCount', 'count', 'Number of hinged enclosure doors.', ['doors']),
  define('doors.frontGapIn', 'length', "Depth left between the closed doors' back face (an inset door's inside the opening) and the furthest-forward appliance front, units set back at the maker’s rear clearance.", ['enclosure.depth', 'doors', 'washer.depth', 'dryer.depth', 'washer.frontProjection', 'dryer.frontProjection', 'washer.clearances.rear', 'dryer.clearances.rear']),
  define('doors.hingeCount', 'count', 'Hinges on the door with the largest shortfall against the chart.', ['doors']),
  define('doors.hingeCountRequired', 'count', 'Hinges the chart asks for on that door, by its height.', ['doors']),
  define('doors.hingeEdgeDistanceMinIn', 'length', 'Least distance from a door’s top or bottom edge to its nearest hinge.', ['doors']),
  define('doors.hingeEdgeDistanceMaxIn', 'length', 'Greatest distance from a door’s top or bottom edge to its nearest hinge.', ['doors']),
  define('doors.clearOpeningWithDoorsOpenIn', 'length', 'Clear width in front of the appliances with the enclosure doors open.', ['doors', 'enclosure.width']),
  define('doors.applianceDoorSpanIn', 'length', 'Width the appliance doors need clear in front of them at one time.', ['arrangement', 'washer.width', 'dryer.width', 'doors']),
];


export function hingesRequired(heightIn: number, params: RuleSetParameters): number {
  const chart = [...params.doors.hingeCountChart].sort((a, b) => a.maxDoorHeightIn - b.maxDoorHeightIn);
  // Chart heights are metric values held to 12 significant digits; a nano-inch of slack keeps
  // a 2000 mm door on the 2000 mm row.
  const row = chart.find((r) => heightIn <= r.maxDoorHeightIn + 1e-9);
  if (row) return row.hinges;
  // Past the chart, one more hinge per step of the chart's last interval (500 mm in the makers' charts).
  const last = chart[chart.length - 1];
  const step = chart.length > 1 ? last.maxDoorHeightIn - chart[chart.length - 2].maxDoorHeightIn : last.maxDoorHeightIn;
  return last.hinges + Math.ceil((heightIn - last.maxDoorHeightIn) / step);
}

function hingedDoors(plan: Plan, need: Need): Array<{ door: Door; index: number }> {
  return need('doors', plan.doors)
    .map((door, index) => ({ door, index }))
    .filter(({ door }) => (door.kind ?? 'hinged') === 'hinged');
}

function edgeDistances(plan: Plan, need: Need): number[] {
  return hingedDoors(plan, need).flatMap(({ door, index }) => {
    const height = need(`doors.${index}.height`, door.height);
    const hinges = need(`doors.${index}.hinges`, door.hinges);
    if (hinges.length === 0) return [];
    return [Math.min(...hinges), height - Math.max(...hinges)];
  });
}

export function computeDoorHardwareFacts(ctx: FactContext): void {
  const { plan, params } = ctx;
  ctx.fact('doors.hingedDoorCount', (need) => hingedDoors(plan, need).length);

  ctx.fact('doors.frontGapIn', (need) => {
    const inside = insideDimension(plan, need, 'depth');
    const reach = Math.max(
      ...units(plan).map(([name, unit]) => overallDepth(need, name, unit) + need(`${name}.clearances.rear`, unit?.clearances?.rear)),
    );
    return inside - reach;
  });

  const worstDoor = (need: Need) => {
    let worst: { provided: number; required: number } | null = null;
    for (const { door, index } of hingedDoors(plan, need)) {
      const provided = need(`doors.${index}.hinges`, door.hinges).length;
      const required = hingesRequired(need(`doors.${index}.height`, door.height), params);
      if (!worst || provided - required < worst.provided - worst.required) worst = { provided, required };
    }
    return worst;
  };
  ctx.fact('doors.hingeCount', (need) => worstDoor(need)?.provided ?? null);
  ctx.fact('doors.hingeCountRequired', (need) => worstDoor(need)?.required ?? null);

  ctx.fact('doors.hingeEdgeDistanceMinIn', (need) => {
    const distances = edgeDistances(plan, need);
    return distances.length > 0 ? Math.min(...distances) : null;
  });
  ctx.fact('doors.hingeEdgeDistanceMaxIn', (need) => {
    const distances = edgeDistances(plan, need);
    return distances.length > 0 ? Math.max(...distances) : null;
  });

  // Common-practice geometry: a hinged leaf open to 90° stands in the opening by about its own
  // thickness; a folded bifold pair by two thicknesses; bypass sliding leaves stack and cover the
  // widest leaf's width. Appliances behind sliding doors are reached one at a time.
  ctx.fact('doors.clearOpeningWithDoorsOpenIn', (need) => {
    const opening = plan.enclosure?.openingWidth ?? insideDimension(plan, need, 'width');
    const doors = need('doors', plan.doors);
    let intrusion = 0;
    let widestSliding = 0;
    doors.forEach((door, index) => {
      const kind = door.kind ?? 'hinged';
      if (kind === 'sliding') widestSliding = Math.max(widestSliding, need(`doors.${index}.width`, door.width));
      else intrusion += need(`doors.${index}.thickness`, door.thickness) * (kind === 'bifold' ? 2 : 1);
    });
    return opening - intrusion - widestSliding;
  });
  ctx.fact('doors.applianceDoorSpanIn', (need) => {
    const arrangement = need('arrangement', plan.arrangement);
    const widths = units(plan).map(([name, unit]) => need(`${name}.width`, unit?.width));
    const sliding = need('doors', plan.doors).some((door) => door.kind === 'sliding');
    if (arrangement === 'stacked' || sliding) return Math.max(...widths);
    return widths[0] + widths[1];
  });
}
