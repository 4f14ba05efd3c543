import { insideDimension } from '@/lib/domain/facts/clearances';
import { doorDetails, type DoorDetails } from '@/lib/domain/facts/door-details';
import type { Appliance, Door, Plan, PlanFieldPath } from '@/lib/domain/plan';
import { measure, MissingList } from '@/lib/domain/drawing/shapes';

/**
 * Where things stand in the closet, shared by the elevation, the plan view and the hinge
 * layout so the three agree. x runs from the left outside face of the enclosure; heights are
 * above the floor; depths run from the back outside face toward the room.
 */
export interface UnitBox {
  name: 'washer' | 'dryer';
  x: number;
  width: number;
  /** Height of the unit's underside above the floor (the washer's top when stacked). */
  bottom: number;
  height: number | null;
  depth: number | null;
  frontProjection: number | null;
  clearances: { side: number | null; top: number | null; rear: number | null; front: number | null };
}

export interface DoorBox {
  index: number;
  kind: 'hinged' | 'bifold' | 'sliding';
  x: number;
  width: number;
  bottom: number;
  height: number | null;
  /** Thickness drawn: the door's own, else the panel thickness (as lib/facts counts it). */
  thickness: number;
  hingeSide: 'left' | 'right';
  /** The side panel the hinges screw to; 'none' for a door meeting another door. */
  mountsOn: 'left-panel' | 'right-panel' | 'none';
  hinges: number[];
  /** Hinge side, fit, gap under the door and cup boring distance: the plan's, or the stated defaults. */
  details: DoorDetails;
}

export interface ClosetLayout {
  hasEnclosure: boolean;
  panel: number;
  outsideWidth: number | null;
  outsideHeight: number | null;
  outsideDepth: number | null;
  insideLeft: number;
  insideWidth: number | null;
  insideHeight: number | null;
  insideDepth: number | null;
  openingWidth: number | null;
  /** Door thickness counted in an outside depth: the thickest door, else one panel. */
  doorAllowance: number;
  toeKickHeight: number;
  arrangement: 'side-by-side' | 'stacked';
  units: UnitBox[];
  doors: DoorBox[];
  missing: PlanFieldPath[];
  notes: string[];
}

function clearance(missing: MissingList, name: 'washer' | 'dryer', unit: Appliance | undefined, side: 'side' | 'top' | 'rear' | 'front') {
  return missing.take(`${name}.clearances.${side}`, unit?.clearances?.[side]) ?? null;
}

export function closetLayout(plan: Plan): ClosetLayout {
  const missing = new MissingList();
  const notes: string[] = [];
  const enclosure = plan.enclosure;

  const measuredHow = missing.take('enclosure.depthMeasured', enclosure?.depthMeasured);
  const panelGiven = missing.take('enclosure.panelThickness', enclosure?.panelThickness);
  if (enclosure?.width !== undefined && measuredHow === undefined) {
    notes.push('The plan does not say whether sizes are outside or inside; drawn as outside sizes.');
  }
  if (enclosure?.width !== undefined && panelGiven === undefined) {
    notes.push('Panel thickness not given; panels drawn with no thickness.');
  }
  const panel = panelGiven ?? 0;
  const how = measuredHow ?? 'outside';
  // Fill the two gaps with the stated assumptions, then let lib/facts do the arithmetic.
  const assumed: Plan = enclosure ? { ...plan, enclosure: { ...enclosure, depthMeasured: how, panelThickness: panel } } : plan;
  const inside = (dimension: 'width' | 'depth' | 'height') => {
    const result = measure((need) => insideDimension(assumed, need, dimension));
    missing.add(result.missing);
    return result.value;
  };
  const insideWidth = inside('width');
  const insideHeight = inside('height');
  const insideDepth = inside('depth');

  const doorAllowance =
    plan.doors === undefined ? panel : plan.doors.reduce((max, door) => Math.max(max, door.thickness ?? panel), 0);
  const outside = (given: number | undefined, insideValue: number | null, extra: number) =>
    given === undefined ? null : how === 'outside' ? given : insideValue === null ? null : insideValue + extra;
  const outsideWidth = outside(enclosure?.width, insideWidth, 2 * panel);
  const outsideHeight = outside(enclosure?.height, insideHeight, panel);
  const outsideDepth = outside(enclosure?.depth, insideDepth, panel + doorAllowance);

  const toeKick = enclosure?.toeKick;
  if (toeKick === undefined) missing.add(['enclosure.toeKick']);
  const toeKickHeight = toeKick ? (missing.take('enclosure.toeKick.height', toeKick.height) ?? 0) : 0;

  const arrangement = missing.take('arrangement', plan.arrangement) ?? 'side-by-side';
  if (plan.arrangement === undefined) notes.push('Arrangement not given; drawn side by side.');

  const specs = (['washer', 'dryer'] as const).map((name) => {
    const unit = plan[name];
    const width = missing.take(`${name}.width`, unit?.width);
    return {
      name,
      width,
      height: missing.take(`${name}.height`, unit?.height) ?? null,
      depth: missing.take(`${name}.depth`, unit?.depth) ?? null,
      frontProjection: missing.take(`${name}.frontProjection`, unit?.frontProjection) ?? null,
      clearances: {
        side: clearance(missing, name, unit, 'side'),
        top: clearance(missing, name, unit, 'top'),
        rear: clearance(missing, name, unit, 'rear'),
        front: clearance(missing, name, unit, 'front'),
      },
    };
  });
  const drawable = specs.filter((s): s is typeof s & { width: number } => s.width !== undefined);

  const insideLeft = outsideWidth === null ? 0 : panel;
  const units: UnitBox[] = [];
  if (arrangement === 'stacked') {
    const groupWidth = Math.max(0, ...drawable.map((s) => s.width + 2 * (s.clearances.side ?? 0)));
    const span = insideWidth ?? groupWidth;
    const washerHeight = specs[0].height;
    for (const s of drawable) {
      const bottom = s.name === 'dryer' ? (washerHeight ?? 0) : 0;
      units.push({ ...s, x: insideLeft + (span - s.width) / 2, bottom });
    }
    if (drawable.some((s) => s.name === 'dryer') && washerHeight === null) {
      notes.push('Washer height not given; the stacked dryer is drawn on the floor.');
    }
  } else {
    // Same sum as clearances.requiredWidthIn: each outer side plus one shared gap.
    const sides = drawable.map((s) => s.clearances.side ?? 0);
    const shared = Math.max(0, ...sides);
    const groupWidth = drawable.reduce((sum, s) => sum + s.width, 0) + (sides[0] ?? 0) + (sides[sides.length - 1] ?? 0) + (drawable.length > 1 ? shared : 0);
    const span = insideWidth ?? groupWidth;
    let x = insideLeft + (span - groupWidth) / 2 + (sides[0] ?? 0);
    for (const s of drawable) {
      units.push({ ...s, x, bottom: 0 });
      x += s.width + shared;
    }
    if (drawable.length === 2) notes.push('Washer drawn on the left, dryer on the right.');
  }

  const doors = layoutDoors(plan.doors, missing, {
    centre: outsideWidth !== null ? outsideWidth / 2 : insideLeft + (insideWidth ?? 0) / 2,
    bottom: toeKickHeight,
    panel,
  });
  const hinged = doors.filter((d) => d.kind === 'hinged');
  if (hinged.some((d) => d.details.gapBelowAssumed)) {
    notes.push(`Doors without a gap under them in the plan are drawn with their bottom edge ${toeKickHeight > 0 ? 'at the top of the toe kick' : 'at the floor'}.`);
  }
  if (hinged.some((d) => d.details.hingeSideAssumed)) {
    notes.push('Hinge sides not in the plan are assumed: a pair hinges on its outer edges, a single door on the left.');
  }

  return {
    hasEnclosure: outsideWidth !== null,
    panel,
    outsideWidth,
    outsideHeight,
    outsideDepth,
    insideLeft,
    insideWidth,
    insideHeight,
    insideDepth,
    openingWidth: enclosure?.openingWidth ?? null,
    doorAllowance,
    toeKickHeight,
    arrangement,
    units,
    doors,
    missing: missing.list(),
    notes,
  };
}

function layoutDoors(
  doors: Door[] | undefined,
  missing: MissingList,
  at: { centre: number; bottom: number; panel: number },
): DoorBox[] {
  if (doors === undefined) {
    missing.add(['doors']);
    return [];
  }
  const placed = doors.flatMap((door, index) => {
    const width = missing.take(`doors.${index}.width`, door.width);
    return width === undefined ? [] : [{ door, index, width }];
  });
  const total = placed.reduce((sum, d) => sum + d.width, 0);
  let x = at.centre - total / 2;
  return placed.map(({ door, index, width }, position) => {
    const kind = door.kind ?? 'hinged';
    const centre = x + width / 2;
    const details = doorDetails(door, centre > at.centre + 1e-9 ? 'right' : 'left');
    const hingeSide = details.hingeSide;
    const outermost = hingeSide === 'left' ? position === 0 : position === placed.length - 1;
    const box: DoorBox = {
      index,
      kind,
      x,
      width,
      bottom: at.bottom + details.gapBelowIn,
      height: missing.take(`doors.${index}.height`, door.height) ?? null,
      thickness: door.thickness ?? at.panel,
      hingeSide,
      mountsOn: kind !== 'hinged' || !outermost ? 'none' : hingeSide === 'left' ? 'left-panel' : 'right-panel',
      hinges: door.hinges ?? [],
      details,
    };
    if (door.thickness === undefined) missing.add([`doors.${index}.thickness`]);
    if (kind === 'hinged' && door.hinges === undefined) missing.add([`doors.${index}.hinges`]);
    x += width;
    return box;
  });
}
