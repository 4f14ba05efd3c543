import type { RuleSetParameters } from '@/lib/domain/params';
import { isPathWithin, type Plan, type PlanFieldPattern } from '@/lib/domain/plan';
import { formatLength } from '@/lib/domain/units';
import { closetLayout, type UnitBox } from '@/lib/domain/drawing/layout';
import { markNotes, toMarks, type Mark, type MarkSource } from '@/lib/domain/drawing/marks';
import { DRAWING_CAUTION, frame, type Drawing, type Shape } from '@/lib/domain/drawing/shapes';

export interface DrawingOptions {
  params: RuleSetParameters;
  /** Findings (or bare rule keys) of the check to mark on the drawing. */
  marks?: readonly MarkSource[];
}

const ELEVATION_RULES = ['clearances.width', 'clearances.height', 'service.removal-width', 'service.toe-kick'];

// What a front view needs; depths belong to the plan view.
const ELEVATION_FIELDS: readonly PlanFieldPattern[] = [
  'enclosure.width',
  'enclosure.height',
  'enclosure.depthMeasured',
  'enclosure.panelThickness',
  'enclosure.openingWidth',
  'enclosure.toeKick',
  'arrangement',
  ...(['washer', 'dryer'] as const).flatMap((unit) => [`${unit}.width`, `${unit}.height`, `${unit}.clearances.side`, `${unit}.clearances.top`] as const),
  'doors',
];

function zoneStatus(marks: Map<string, Mark>, ruleKey: string) {
  const mark = marks.get(ruleKey);
  return mark ? { role: 'clearance-fail' as const, status: mark.status, ruleKey } : { role: 'clearance' as const, ruleKey };
}

/** Front view of the closet with the doors shown as outlines over the units, to scale. */
export function frontElevation(plan: Plan, options: DrawingOptions): Drawing {
  const layout = closetLayout(plan);
  const marks = toMarks(options.marks);
  const units = plan.units;
  const fmt = (inches: number) => formatLength(inches, units);
  const y = (aboveFloor: number) => -aboveFloor;

  const extent = Math.max(layout.outsideWidth ?? 0, layout.outsideHeight ?? 0, ...layout.units.map((u) => u.x + u.width), 24);
  const text = extent / 48;
  const shapes: Shape[] = [];

  const left = layout.hasEnclosure ? 0 : Math.min(0, ...layout.units.map((u) => u.x));
  const right = layout.outsideWidth ?? Math.max(0, ...layout.units.map((u) => u.x + u.width));
  shapes.push({ kind: 'line', role: 'floor', from: [left - text * 2, 0], to: [right + text * 2, 0] });

  const { outsideWidth: W, outsideHeight: H, panel: t } = layout;
  if (W !== null && H !== null) {
    shapes.push({ kind: 'rect', role: 'panel', x: 0, y: y(H), width: t, height: H });
    shapes.push({ kind: 'rect', role: 'panel', x: W - t, y: y(H), width: t, height: H });
    shapes.push({ kind: 'rect', role: 'panel', x: t, y: y(H), width: W - 2 * t, height: t });
    if (layout.openingWidth !== null && layout.insideWidth !== null && layout.openingWidth < layout.insideWidth) {
      // A face frame narrows the opening: show its stiles inside the panels.
      const stile = (layout.insideWidth - layout.openingWidth) / 2;
      shapes.push({ kind: 'rect', role: 'panel', x: t, y: y(H - t), width: stile, height: H - t });
      shapes.push({ kind: 'rect', role: 'panel', x: W - t - stile, y: y(H - t), width: stile, height: H - t });
    }
    shapes.push({ kind: 'rect', role: 'enclosure', x: 0, y: y(H), width: W, height: H });
    shapes.push({ kind: 'dimension', role: 'dimension', from: [0, y(H)], to: [W, y(H)], offset: text * 2.5, valueIn: W, label: `${fmt(W)} outside`, size: text });
    shapes.push({ kind: 'dimension', role: 'dimension', from: [0, 0], to: [0, y(H)], offset: text * 2.5, valueIn: H, label: `${fmt(H)} outside`, size: text });
    if (layout.insideWidth !== null && layout.insideHeight !== null) {
      const top = y(layout.insideHeight);
      shapes.push({ kind: 'dimension', role: 'dimension', from: [t, top], to: [t + layout.insideWidth, top], offset: -text * 1.6, valueIn: layout.insideWidth, label: `${fmt(layout.insideWidth)} inside`, size: text });
      shapes.push({ kind: 'dimension', role: 'dimension', from: [W, 0], to: [W, top], offset: -text * 2.5, valueIn: layout.insideHeight, label: `${fmt(layout.insideHeight)} inside`, size: text });
    }
  } else if (W !== null) {
    shapes.push({ kind: 'dimension', role: 'dimension', from: [0, 0], to: [W, 0], offset: -text * 5, valueIn: W, label: `${fmt(W)} outside`, size: text });
  }

  const sideZone = zoneStatus(marks, 'clearances.width');
  const topZone = zoneStatus(marks, 'clearances.height');
  for (const unit of layout.units) drawUnit(shapes, unit, { text, fmt, y, sideZone, topZone });

  if (layout.toeKickHeight > 0) {
    const kickLeft = layout.hasEnclosure ? t : left;
    const kickWidth = layout.insideWidth ?? right - left;
    const kickMark = marks.get('service.toe-kick');
    shapes.push({ kind: 'rect', role: 'toe-kick', x: kickLeft, y: y(layout.toeKickHeight), width: kickWidth, height: layout.toeKickHeight, status: kickMark?.status, ruleKey: 'service.toe-kick' });
    shapes.push({ kind: 'dimension', role: 'dimension', from: [kickLeft, 0], to: [kickLeft, y(layout.toeKickHeight)], offset: -text * 1.2, valueIn: layout.toeKickHeight, label: `toe kick ${fmt(layout.toeKickHeight)}`, size: text * 0.8 });
    if (kickMark) shapes.push({ kind: 'mark', role: 'status-mark', at: [kickLeft + kickWidth / 2, y(layout.toeKickHeight / 2)], size: text * 1.2, status: kickMark.status, ruleKey: 'service.toe-kick' });
  }

  for (const door of layout.doors) {
    if (door.height === null) continue;
    const top = y(door.bottom + door.height);
    shapes.push({ kind: 'rect', role: 'door', x: door.x, y: top, width: door.width, height: door.height, dashed: true });
    const edge = door.hingeSide === 'left' ? door.x : door.x + door.width;
    const inward = door.hingeSide === 'left' ? 1 : -1;
    if (door.kind === 'hinged') {
      for (const position of door.hinges) {
        const hy = y(door.bottom + position);
        shapes.push({ kind: 'line', role: 'hinge', from: [edge, hy - text * 0.6], to: [edge, hy + text * 0.6] });
        shapes.push({ kind: 'line', role: 'hinge', from: [edge, hy], to: [edge + inward * text * 0.9, hy] });
      }
    }
    const kindLabel = door.kind === 'hinged' ? `door ${door.index + 1}, hinged ${door.hingeSide}` : `door ${door.index + 1}, ${door.kind}`;
    shapes.push({ kind: 'text', role: 'label', at: [door.x + door.width / 2, top + text * 4], text: kindLabel, size: text * 0.8, anchor: 'middle' });
  }

  const removal = marks.get('service.removal-width');
  if (removal && W !== null && H !== null) {
    shapes.push({ kind: 'mark', role: 'status-mark', at: [W / 2, y(H) - text * 4.2], size: text * 1.2, status: removal.status, ruleKey: 'service.removal-width' });
  }

  const framed = frame(shapes, text * 1.5);
  return {
    kind: 'front-elevation',
    title: 'Front elevation',
    scale: 'to-scale',
    ...framed,
    missing: layout.missing.filter((path) => isPathWithin(path, ELEVATION_FIELDS)),
    notes: [...layout.notes, ...markNotes(marks, ELEVATION_RULES)],
    caution: DRAWING_CAUTION,
  };
}

function drawUnit(
  shapes: Shape[],
  unit: UnitBox,
  ctx: {
    text: number;
    fmt: (inches: number) => string;
    y: (aboveFloor: number) => number;
    sideZone: ReturnType<typeof zoneStatus>;
    topZone: ReturnType<typeof zoneStatus>;
  },
): void {
  const { text, fmt, y } = ctx;
  const height = unit.height;
  const label = unit.name === 'washer' ? 'Washer' : 'Dryer';
  if (height === null) {
    shapes.push({ kind: 'line', role: unit.name, from: [unit.x, y(unit.bottom)], to: [unit.x + unit.width, y(unit.bottom)] });
    shapes.push({ kind: 'text', role: 'label', at: [unit.x + unit.width / 2, y(unit.bottom) - text * 0.6], text: `${label} (height not given)`, size: text * 0.8, anchor: 'middle' });
    return;
  }
  const top = y(unit.bottom + height);
  const side = unit.clearances.side ?? 0;
  if (side > 0) {
    shapes.push({ kind: 'rect', ...ctx.sideZone, x: unit.x - side, y: top, width: side, height });
    shapes.push({ kind: 'rect', ...ctx.sideZone, x: unit.x + unit.width, y: top, width: side, height });
  }
  const topClearance = unit.clearances.top ?? 0;
  if (topClearance > 0) shapes.push({ kind: 'rect', ...ctx.topZone, x: unit.x, y: top - topClearance, width: unit.width, height: topClearance });
  for (const zone of [ctx.sideZone, ctx.topZone]) {
    if ('status' in zone && zone.status) {
      const at: [number, number] = zone === ctx.sideZone ? [unit.x - side / 2, top + height * 0.2] : [unit.x + unit.width * 0.85, top - topClearance - text];
      shapes.push({ kind: 'mark', role: 'status-mark', at, size: text * 1.1, status: zone.status, ruleKey: zone.ruleKey });
    }
  }

  shapes.push({ kind: 'rect', role: unit.name, x: unit.x, y: top, width: unit.width, height });
  const radius = Math.min(unit.width, height) * 0.28;
  shapes.push({ kind: 'circle', role: 'appliance-detail', centre: [unit.x + unit.width / 2, top + height * 0.55], radius });
  shapes.push({ kind: 'text', role: 'label', at: [unit.x + unit.width / 2, top + text * 1.5], text: label, size: text, anchor: 'middle', weight: 'bold' });
  // A unit on the floor is dimensioned below the floor line; a stacked one above its top clearance.
  const widthDimension = unit.bottom > 0
    ? { from: [unit.x, top] as const, to: [unit.x + unit.width, top] as const, offset: topClearance + text * 0.8 }
    : { from: [unit.x, 0] as const, to: [unit.x + unit.width, 0] as const, offset: -text * 1.4 };
  shapes.push({ kind: 'dimension', role: 'dimension', ...widthDimension, valueIn: unit.width, label: fmt(unit.width), size: text * 0.85 });
  shapes.push({ kind: 'dimension', role: 'dimension', from: [unit.x + unit.width, y(unit.bottom)], to: [unit.x + unit.width, top], offset: text * 1.2, valueIn: height, label: fmt(height), size: text * 0.85 });
}
