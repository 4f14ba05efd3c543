import { computeFactsWithMissing } from '@/lib/domain/facts';
import type { Plan } from '@/lib/domain/plan';
import { formatLength } from '@/lib/domain/units';
import type { DrawingOptions } from '@/lib/domain/drawing/front-elevation';
import { closetLayout, type DoorBox } from '@/lib/domain/drawing/layout';
import { markNotes, toMarks } from '@/lib/domain/drawing/marks';
import { DRAWING_CAUTION, frame, type Drawing, type Point, type Shape } from '@/lib/domain/drawing/shapes';

const PLAN_RULES = ['clearances.depth', 'clearances.rear-zone', 'door-hardware.hinge-arm-room', 'door-hardware.appliance-door-swing'];

const PLAN_FIELDS =
  /^(enclosure\.(width|depth|depthMeasured|panelThickness)|arrangement|(washer|dryer)\.(width|depth|frontProjection|clearances\.(side|rear|front))|doors(\.\d+\.(width|thickness|kind))?)$/;

// A bifold pair, folded open, stands about this far off square (common practice, no published source).
const BIFOLD_FOLD_DEG = 15;

/**
 * The closet from above, back wall at the top and the room at the bottom, to scale. Units are
 * set back at the maker's rear clearance, where doors.frontGapIn places them.
 */
export function planView(plan: Plan, options: DrawingOptions): Drawing {
  const layout = closetLayout(plan);
  const marks = toMarks(options.marks);
  const { facts } = computeFactsWithMissing(plan, options.params);
  const fmt = (inches: number) => formatLength(inches, plan.units);
  const { outsideWidth: W, panel: t, insideWidth, insideDepth } = layout;

  const extent = Math.max(W ?? 0, layout.outsideDepth ?? 0, ...layout.units.map((u) => u.x + u.width), 24);
  const text = extent / 40;
  const shapes: Shape[] = [];
  const notes = [...layout.notes.filter((n) => !n.startsWith('Doors drawn with their bottom')), 'Units drawn set back at the maker’s rear clearance.'];

  const back = layout.hasEnclosure ? t : 0;
  const doorInner = insideDepth !== null ? back + insideDepth : null;
  const left = layout.hasEnclosure ? t : Math.min(0, ...layout.units.map((u) => u.x));
  const width = insideWidth ?? Math.max(0, ...layout.units.map((u) => u.x + u.width)) - left;

  // The zone wanted behind the units, drawn first so the units sit over it where they reach into it.
  const rearRequired = facts['clearances.rearZoneRequiredIn'] as number | null;
  const rearMark = marks.get('clearances.rear-zone');
  if (rearRequired !== null && rearRequired > 0) {
    shapes.push({ kind: 'rect', role: 'rear-zone', x: left, y: back, width, height: rearRequired, status: rearMark?.status, ruleKey: 'clearances.rear-zone' });
  }

  if (W !== null) {
    const sideDepth = doorInner ?? back;
    shapes.push({ kind: 'rect', role: 'panel', x: 0, y: 0, width: W, height: t });
    shapes.push({ kind: 'rect', role: 'panel', x: 0, y: 0, width: t, height: sideDepth });
    shapes.push({ kind: 'rect', role: 'panel', x: W - t, y: 0, width: t, height: sideDepth });
    shapes.push({ kind: 'polyline', role: 'enclosure', points: [[0, sideDepth], [0, 0], [W, 0], [W, sideDepth]], closed: false });
    shapes.push({ kind: 'dimension', role: 'dimension', from: [0, 0], to: [W, 0], offset: text * 2, valueIn: W, label: `${fmt(W)} outside`, size: text });
  }
  if (layout.outsideDepth !== null && W !== null) {
    shapes.push({ kind: 'dimension', role: 'dimension', from: [0, layout.outsideDepth], to: [0, 0], offset: text * 2, valueIn: layout.outsideDepth, label: `${fmt(layout.outsideDepth)} outside`, size: text });
  }
  if (doorInner !== null && insideDepth !== null && W !== null) {
    shapes.push({ kind: 'dimension', role: 'dimension', from: [W, back], to: [W, doorInner], offset: text * 2, valueIn: insideDepth, label: `${fmt(insideDepth)} inside`, size: text });
  }
  const rearZone = facts['clearances.rearZoneIn'] as number | null;
  if (rearZone !== null && rearZone > 0 && W !== null) {
    shapes.push({ kind: 'dimension', role: 'dimension', status: rearMark?.status, ruleKey: 'clearances.rear-zone', from: [W, back], to: [W, back + rearZone], offset: text * 5, valueIn: rearZone, label: `${fmt(rearZone)} behind`, size: text * 0.8 });
    notes.push(`With the units pulled forward to their front clearance, ${fmt(rearZone)} is left behind them${rearRequired !== null ? ` (${fmt(rearRequired)} wanted)` : ''}.`);
  } else if (rearZone !== null && rearZone <= 0) {
    notes.push(`Even pulled forward to their front clearance the units leave no room behind them: the depth is ${fmt(-rearZone)} short before any rear zone.`);
  }

  const stacked = layout.arrangement === 'stacked';
  const depthMark = marks.get('clearances.depth');
  let deepest: { reach: number; x: number } | null = null;
  layout.units.forEach((unit, order) => {
    const rear = unit.clearances.rear ?? 0;
    const unitBack = back + rear;
    const hidden = stacked && order > 0;
    const zone = depthMark ? { role: 'clearance-fail' as const, status: depthMark.status } : { role: 'clearance' as const };
    if (rear > 0 && !hidden) shapes.push({ kind: 'rect', ...zone, ruleKey: 'clearances.depth', x: unit.x, y: back, width: unit.width, height: rear });
    if (unit.depth === null) {
      shapes.push({ kind: 'line', role: unit.name, from: [unit.x, unitBack], to: [unit.x + unit.width, unitBack] });
      shapes.push({ kind: 'text', role: 'label', at: [unit.x + unit.width / 2, unitBack + text * 1.2], text: `${unit.name} (depth not given)`, size: text * 0.8, anchor: 'middle' });
      return;
    }
    const front = unitBack + unit.depth;
    shapes.push({ kind: 'rect', role: unit.name, x: unit.x, y: unitBack, width: unit.width, height: unit.depth, dashed: hidden });
    const projection = unit.frontProjection ?? 0;
    if (projection > 0) shapes.push({ kind: 'rect', role: 'appliance-front', x: unit.x + unit.width * 0.08, y: front, width: unit.width * 0.84, height: projection, dashed: hidden });
    const frontClearance = unit.clearances.front ?? 0;
    if (frontClearance > 0 && !hidden) shapes.push({ kind: 'rect', ...zone, ruleKey: 'clearances.depth', x: unit.x, y: front + projection, width: unit.width, height: frontClearance });
    const name = unit.name === 'washer' ? 'Washer' : 'Dryer';
    const label = stacked ? (order === 0 ? `${name} (dryer stacked above)` : '') : name;
    if (label) shapes.push({ kind: 'text', role: 'label', at: [unit.x + unit.width / 2, unitBack + unit.depth / 2], text: label, size: text * (stacked ? 0.8 : 1), anchor: 'middle', weight: 'bold' });
    if (!hidden) shapes.push({ kind: 'dimension', role: 'dimension', from: [unit.x, unitBack], to: [unit.x, front], offset: -text * 1.2, valueIn: unit.depth, label: fmt(unit.depth), size: text * 0.8 });
    const reach = front + projection;
    if (!deepest || reach > deepest.reach) deepest = { reach, x: unit.x + unit.width / 2 };
  });
  if (depthMark) notes.push(...markNotes(marks, ['clearances.depth']));

  const hinged = layout.doors.some((d) => d.kind === 'hinged');
  const armMark = marks.get('door-hardware.hinge-arm-room');
  if (hinged && doorInner !== null) {
    const arm = options.params.doors.hingeArmDepthIn;
    shapes.push({ kind: 'rect', role: 'hinge-arm-zone', x: left, y: doorInner - arm, width, height: arm, status: armMark?.status, ruleKey: 'door-hardware.hinge-arm-room' });
    const gap = facts['doors.frontGapIn'] as number | null;
    const reach = deepest as { reach: number; x: number } | null;
    if (gap !== null && reach) {
      shapes.push({ kind: 'dimension', role: 'dimension', status: armMark?.status, ruleKey: 'door-hardware.hinge-arm-room', from: [reach.x, doorInner - gap], to: [reach.x, doorInner], offset: 0, valueIn: gap, label: fmt(gap), size: text * 0.75 });
      notes.push(`${fmt(gap)} is left between the furthest-forward appliance front and the closed doors; hinge arms want ${fmt(arm)}.`);
      if (armMark) shapes.push({ kind: 'mark', role: 'status-mark', at: [reach.x - text * 1.5, doorInner - arm / 2], size: text, status: armMark.status, ruleKey: 'door-hardware.hinge-arm-room' });
    }
  }
  if (rearMark && rearRequired !== null) shapes.push({ kind: 'mark', role: 'status-mark', at: [left + width - text, back + rearRequired / 2], size: text, status: rearMark.status, ruleKey: 'clearances.rear-zone' });

  if (doorInner !== null) {
    const swingMark = marks.get('door-hardware.appliance-door-swing');
    let maxSwing = 0;
    layout.doors.forEach((door, position) => {
      maxSwing = Math.max(maxSwing, drawDoor(shapes, door, position, doorInner, text, swingMark?.status));
    });
    for (const door of layout.doors) {
      const outer = doorInner + door.thickness;
      shapes.push({ kind: 'dimension', role: 'dimension', from: [door.x, outer], to: [door.x + door.width, outer], offset: -(maxSwing + text * 1.2), valueIn: door.width, label: `door ${door.index + 1}: ${fmt(door.width)}`, size: text * 0.8 });
    }
  } else if (layout.doors.length > 0) {
    notes.push('Enclosure depth not known, so the doors are not placed.');
  }

  const framed = frame(shapes, text * 1.5);
  return {
    kind: 'plan-view',
    title: 'Plan view (from above)',
    scale: 'to-scale',
    ...framed,
    missing: layout.missing.filter((path) => PLAN_FIELDS.test(path)),
    notes: [...notes, ...markNotes(marks, PLAN_RULES.filter((k) => k !== 'clearances.depth'))],
    caution: DRAWING_CAUTION,
  };
}

/** Draws one closed door and how it opens; returns how far the open door reaches into the room. */
function drawDoor(shapes: Shape[], door: DoorBox, position: number, doorInner: number, text: number, status?: 'fail' | 'caution'): number {
  const thickness = door.thickness;
  if (door.kind === 'sliding') {
    // Bypass leaves run on two tracks, one behind the other.
    const y = doorInner + (position % 2) * thickness;
    shapes.push({ kind: 'rect', role: 'door', x: door.x, y, width: door.width, height: thickness });
    const mid = y + thickness / 2;
    shapes.push({ kind: 'line', role: 'door-swing', status, from: [door.x + door.width * 0.25, mid + text * 0.9], to: [door.x + door.width * 0.75, mid + text * 0.9] });
    shapes.push({ kind: 'text', role: 'label', at: [door.x + door.width / 2, mid + text * 2.2], text: 'slides', size: text * 0.7, anchor: 'middle' });
    return thickness * 2 + text * 2.5;
  }
  const y = doorInner;
  shapes.push({ kind: 'rect', role: 'door', x: door.x, y, width: door.width, height: thickness });
  const outer = y + thickness;
  const pivot: Point = door.hingeSide === 'left' ? [door.x, outer] : [door.x + door.width, outer];
  const away = door.hingeSide === 'left' ? 1 : -1;
  if (door.kind === 'bifold') {
    const half = door.width / 2;
    const a = (BIFOLD_FOLD_DEG * Math.PI) / 180;
    const knee: Point = [pivot[0] + away * half * Math.sin(a), pivot[1] + half * Math.cos(a)];
    const end: Point = [pivot[0] + away * 2 * half * Math.sin(a), pivot[1]];
    shapes.push({ kind: 'polyline', role: 'door-swing', status, points: [pivot, knee, end], closed: false });
    return half;
  }
  // A hinged leaf swings out into the room through a quarter turn.
  const [start, end] = door.hingeSide === 'left' ? [0, 90] : [90, 180];
  shapes.push({ kind: 'arc', role: 'door-swing', status, centre: pivot, radius: door.width, startDeg: start, endDeg: end, dashed: true });
  shapes.push({ kind: 'line', role: 'door-swing', status, from: pivot, to: [pivot[0], pivot[1] + door.width] });
  return door.width;
}
