import { hingesRequired } from '@/lib/domain/facts';
import { isPathWithin, type Plan, type PlanFieldPath, type PlanFieldPattern } from '@/lib/domain/plan';
import { formatLength, inchesToMm, mmToInches, type UnitSystem } from '@/lib/domain/units';
import { doorDetails, type Mounting } from '@/lib/domain/facts/door-details';
import {
  CUP_BORING_RANGE_MM,
  CUP_DIAMETER_MM,
  cupRadiusIn,
  PLATE_HOLE_SPACING_MM,
  PLATE_SETBACK_MAX_DOOR_MM,
  PLATE_SETBACK_MM,
  plateHoleSpacingIn,
  plateSetbackIn,
  SCALE_CHECK_MM,
  TEMPLATE_SHEET_IN,
} from '@/lib/domain/drawing/constants';
import type { DrawingOptions } from '@/lib/domain/drawing/front-elevation';
import { closetLayout, type ClosetLayout, type DoorBox } from '@/lib/domain/drawing/layout';
import { markNotes, toMarks, type Mark } from '@/lib/domain/drawing/marks';
import { DRAWING_CAUTION, frame, mirrorX, wrapText, type Drawing, type MarkStatus, type Shape } from '@/lib/domain/drawing/shapes';

// The enclosure's inside height, where the hinge layout starts, comes from these.
const INSIDE_HEIGHT_FIELDS: readonly PlanFieldPattern[] = ['enclosure.height', 'enclosure.depthMeasured', 'enclosure.panelThickness'];

export interface HingePosition {
  /** 1 is the top hinge. */
  number: number;
  /** As the plan gives it: cup centre above the door's bottom edge. */
  fromDoorBottomIn: number;
  /** Cup centre below the door's top edge: door height − position from the bottom. */
  fromDoorTopIn: number | null;
  /** Plate centre below the top of the opening (underside of the top panel). */
  plateFromOpeningTopIn: number | null;
  /** Plate centre below the top end of the side panel, which runs the full height. */
  plateFromPanelTopIn: number | null;
}

export interface DoorHingeLayout {
  doorIndex: number;
  hingeSide: 'left' | 'right';
  mountsOn: DoorBox['mountsOn'];
  heightIn: number | null;
  widthIn: number | null;
  thicknessIn: number | null;
  /** Door edge to cup centre: boring distance plus half the 35 mm cup. */
  cupCentreFromDoorEdgeIn: number;
  /** Door edge to the rim of the cup hole: the plan's, or the default (common practice, no published source). */
  cupBoringDistanceIn: number;
  mounting: Mounting;
  /** Side panel front edge to the plate centre line (PLATE_SETBACK_MM, common practice). */
  plateSetbackIn: number;
  positions: HingePosition[];
  /** Door and side panel side by side, to scale, dimensioned from the top. */
  overview: Drawing;
  /** Drilling template to print at full size, one sheet per door. */
  template: Drawing;
  missing: string[];
  notes: string[];
}

// A generic two-hole plate footprint, only to show where the plate lands (common practice, no published source).
const PLATE_FOOTPRINT_MM = { width: 14, height: 46 };
const HOLE_MARK_MM = 1.5;

/** Lengths on a drilling template: the plan's units, with millimetres beside inches. */
function templateLength(inches: number, units: UnitSystem): string {
  if (units === 'metric') return formatLength(inches, 'metric');
  return `${formatLength(inches, 'imperial')} (${formatLength(inches, 'metric')})`;
}

function sideName(mountsOn: DoorBox['mountsOn']): string {
  return mountsOn === 'left-panel' ? 'left side panel' : mountsOn === 'right-panel' ? 'right side panel' : 'stile or partition';
}

/** One layout per hinged door; bifold and sliding doors carry no cup hinges. */
export function hingeLayouts(plan: Plan, options: DrawingOptions): DoorHingeLayout[] {
  const layout = closetLayout(plan);
  const marks = toMarks(options.marks);
  return (plan.doors ?? []).flatMap((door, index) => {
    if ((door.kind ?? 'hinged') !== 'hinged') return [];
    const box = layout.doors.find((d) => d.index === index);
    return [doorLayout(plan, layout, index, box, marks, options)];
  });
}

function doorLayout(
  plan: Plan,
  layout: ClosetLayout,
  index: number,
  box: DoorBox | undefined,
  marks: Map<string, Mark>,
  options: DrawingOptions,
): DoorHingeLayout {
  const door = plan.doors![index];
  const missing: PlanFieldPath[] = [];
  const notes: string[] = [];
  const height = door.height ?? null;
  if (height === null) missing.push(`doors.${index}.height`);
  if (door.width === undefined) missing.push(`doors.${index}.width`);
  if (door.thickness === undefined) missing.push(`doors.${index}.thickness`);
  if (door.hinges === undefined) missing.push(`doors.${index}.hinges`);
  if (layout.insideHeight === null) missing.push(...layout.missing.filter((p) => isPathWithin(p, INSIDE_HEIGHT_FIELDS)));

  const details = box?.details ?? doorDetails(door);
  const bottom = box?.bottom ?? layout.toeKickHeight + details.gapBelowIn;
  const hingeSide = details.hingeSide;
  const mountsOn = box?.mountsOn ?? 'none';
  const sideKnown = layout.hasEnclosure && layout.panel > 0;

  const positions: HingePosition[] = [...(door.hinges ?? [])]
    .sort((a, b) => b - a)
    .map((fromBottom, i) => {
      const plateAboveFloor = bottom + fromBottom;
      const fromOpeningTop = layout.insideHeight === null ? null : layout.insideHeight - plateAboveFloor;
      return {
        number: i + 1,
        fromDoorBottomIn: fromBottom,
        fromDoorTopIn: height === null ? null : height - fromBottom,
        plateFromOpeningTopIn: fromOpeningTop,
        plateFromPanelTopIn: fromOpeningTop === null || !sideKnown ? null : fromOpeningTop + layout.panel,
      };
    });

  const n = index + 1;
  const base0 = layout.toeKickHeight;
  const gapText = details.gapBelowIn > 0 ? `${formatLength(details.gapBelowIn, plan.units)} above ${base0 > 0 ? 'the top of the toe kick' : 'the floor'} (the plan's gap under the door), ${formatLength(bottom, plan.units)} above the floor` : base0 > 0 ? `at the top of the toe kick, ${formatLength(bottom, plan.units)} above the floor` : 'at the floor';
  const hangNote = `Plate heights assume door ${n} hangs with its bottom edge ${gapText}; re-measure if it hangs otherwise.`;
  const boringMm = Number(inchesToMm(details.cupBoringDistanceIn).toFixed(1));
  const boringText = details.cupBoringAssumed
    ? `cup boring distance ${boringMm} mm (not in the plan: common practice, no published source)`
    : `cup boring distance ${boringMm} mm (the plan's)`;
  const setbackNote = `Plate centre line ${PLATE_SETBACK_MM} mm from the front edge (common practice for full-overlay doors with a 0 mm plate, no published source) and ${boringText}. The hinge maker's chart governs.`;
  notes.push('The plan gives hinge positions from the bottom of the door; here they are measured from the top (door height less the position from the bottom).');
  notes.push(hangNote, setbackNote);
  if (mountsOn === 'none') notes.push(`Door ${n} meets another door on its hinge side: mount its plates on a stile or partition and measure from that front edge.`);
  if (door.thickness !== undefined && inchesToMm(door.thickness) > PLATE_SETBACK_MAX_DOOR_MM) {
    notes.push(`Door ${n} is thicker than ${PLATE_SETBACK_MAX_DOOR_MM} mm: check the hinge maker's chart for the boring distance, cup and plate setback.`);
  }
  const insetNote = `Door ${n} is inset: it closes inside the opening, so its hinges need the maker's inset plates or arms and their own setback; the ${PLATE_SETBACK_MM} mm line is for overlay doors.`;
  if (details.mounting === 'inset') {
    notes.push(insetNote);
  } else if (details.mountingAssumed) {
    notes.push(`Door ${n} is drawn as an overlay door (the plan does not say overlay or inset).`);
  }
  if (details.boringOutsideRange) {
    notes.push(`Door ${n}'s cup boring distance of ${boringMm} mm is outside the ${CUP_BORING_RANGE_MM.min}–${CUP_BORING_RANGE_MM.max} mm hinge makers allow: check the hinge maker's chart.`);
  }
  if (door.hinges !== undefined && door.hinges.length === 0) notes.push(`Door ${n} has no hinge positions in the plan.`);
  if (positions.some((p) => p.plateFromOpeningTopIn !== null && p.plateFromOpeningTopIn < 0)) {
    notes.push(`A hinge of door ${n} would sit above the opening: check the door height and where it hangs.`);
  }
  if (height !== null && door.hinges !== undefined) {
    const required = hingesRequired(height, options.params);
    if (door.hinges.length < required) notes.push(`Door ${n} has ${door.hinges.length} hinges; the hinge makers' chart asks for ${required} at its height.`);
  }
  notes.push(...markNotes(marks, ['door-hardware.hinge-count', 'door-hardware.hinge-positions']));

  // An end hinge outside the makers' edge band, measured as lib/facts measures it (nearest hinge to each end).
  const edgeMark = marks.get('door-hardware.hinge-positions');
  const { hingeEdgeMinIn, hingeEdgeMaxIn } = options.params.doors;
  const flagged = new Set<number>();
  if (edgeMark && height !== null && positions.length > 0) {
    const ends = [positions[positions.length - 1], positions[0]];
    const distances = [ends[0].fromDoorBottomIn, height - ends[1].fromDoorBottomIn];
    distances.forEach((d, i) => {
      if (d < hingeEdgeMinIn - 1e-9 || d > hingeEdgeMaxIn + 1e-9) flagged.add(ends[i].number);
    });
  }

  const base = {
    doorIndex: index,
    hingeSide,
    mountsOn,
    heightIn: height,
    widthIn: door.width ?? null,
    thicknessIn: door.thickness ?? null,
    cupCentreFromDoorEdgeIn: details.cupCentreFromEdgeIn,
    cupBoringDistanceIn: details.cupBoringDistanceIn,
    mounting: details.mounting,
    plateSetbackIn,
    positions,
    missing,
    notes,
  };
  return {
    ...base,
    overview: overviewDrawing(plan, layout, base, bottom, flagged, edgeMark?.status),
    template: templateDrawing(plan.units, base, [setbackNote, hangNote, ...(details.mounting === 'inset' ? [insetNote] : [])]),
  };
}

type LayoutBase = Omit<DoorHingeLayout, 'overview' | 'template'>;

function overviewDrawing(plan: Plan, layout: ClosetLayout, d: LayoutBase, bottom: number, flagged: Set<number>, status?: MarkStatus): Drawing {
  const fmt = (inches: number) => formatLength(inches, plan.units);
  const y = (aboveFloor: number) => -aboveFloor;
  const n = d.doorIndex + 1;
  const positionsTop = d.positions.map((p) => bottom + p.fromDoorBottomIn);
  const doorTop = d.heightIn === null ? null : bottom + d.heightIn;
  const panelTop = layout.outsideHeight ?? doorTop ?? Math.max(0, ...positionsTop) + 6;
  const panelDepth = layout.insideDepth !== null ? layout.panel + layout.insideDepth : null;
  const stub = panelDepth ?? 6;
  const doorWidth = d.widthIn ?? 12;
  const extent = Math.max(panelTop, doorWidth + stub, 24);
  const text = extent / 45;
  const gap = text * 3;
  const edge = -gap; // the door's hinge edge
  const front = gap; // the side panel's front edge
  const shapes: Shape[] = [];

  // Door back face, hinge edge toward the panel, as if the door were opened flat against it.
  if (doorTop !== null) {
    shapes.push({ kind: 'rect', role: 'door', x: edge - doorWidth, y: y(doorTop), width: doorWidth, height: d.heightIn as number, dashed: d.widthIn === null });
    shapes.push({ kind: 'dimension', role: 'dimension', from: [edge - doorWidth, y(bottom)], to: [edge - doorWidth, y(doorTop)], offset: text * 1.5, valueIn: d.heightIn as number, label: `door ${fmt(d.heightIn as number)}`, size: text });
  } else {
    shapes.push({ kind: 'line', role: 'door', from: [edge, y(bottom)], to: [edge, y(panelTop)], dashed: true });
  }
  shapes.push({ kind: 'text', role: 'label', at: [edge - doorWidth / 2, text * 1.6], text: `Door ${n}, back face`, size: text, anchor: 'middle', weight: 'bold' });

  shapes.push({ kind: 'rect', role: 'panel', x: front, y: y(panelTop), width: stub, height: panelTop, dashed: panelDepth === null });
  if (layout.insideHeight !== null) {
    shapes.push({ kind: 'line', role: 'centre-line', from: [front, y(layout.insideHeight)], to: [front + stub, y(layout.insideHeight)], dashed: true });
    shapes.push({ kind: 'text', role: 'note', at: [front + stub / 2, y(layout.insideHeight) + text * 1.1], text: 'top of opening', size: text * 0.75, anchor: 'middle' });
  }
  shapes.push({ kind: 'text', role: 'label', at: [front + stub / 2, text * 1.6], text: `${sideName(d.mountsOn)[0].toUpperCase()}${sideName(d.mountsOn).slice(1)}, inside face`, size: text, anchor: 'middle', weight: 'bold' });
  shapes.push({ kind: 'line', role: 'floor', from: [edge - doorWidth - text * 2, 0], to: [front + stub + text * 2, 0] });

  const plateW = mmToInches(PLATE_FOOTPRINT_MM.width);
  const plateH = mmToInches(PLATE_FOOTPRINT_MM.height);
  d.positions.forEach((p, i) => {
    const hy = y(positionsTop[i]);
    const cupX = edge - d.cupCentreFromDoorEdgeIn;
    const plateX = front + d.plateSetbackIn;
    const mark = flagged.has(p.number) ? status : undefined;
    shapes.push({ kind: 'line', role: 'centre-line', from: [cupX - text, hy], to: [plateX + text, hy], dashed: true });
    shapes.push({ kind: 'circle', role: 'cup', centre: [cupX, hy], radius: cupRadiusIn, status: mark, ruleKey: 'door-hardware.hinge-positions' });
    shapes.push({ kind: 'rect', role: 'plate', x: plateX - plateW / 2, y: hy - plateH / 2, width: plateW, height: plateH });
    if (mark) shapes.push({ kind: 'mark', role: 'status-mark', at: [cupX - text * 2.2, hy], size: text, status: mark, ruleKey: 'door-hardware.hinge-positions' });
    if (p.fromDoorTopIn !== null && doorTop !== null) {
      shapes.push({ kind: 'dimension', role: 'dimension', from: [edge, y(doorTop)], to: [edge, hy], offset: -(text * 1.4 * (i + 1)), valueIn: p.fromDoorTopIn, label: `${fmt(p.fromDoorTopIn)}`, size: text * 0.85 });
    }
    if (p.plateFromOpeningTopIn !== null && layout.insideHeight !== null) {
      shapes.push({ kind: 'dimension', role: 'dimension', from: [front + stub, y(layout.insideHeight)], to: [front + stub, hy], offset: text * 1.4 * (i + 1), valueIn: p.plateFromOpeningTopIn, label: `${fmt(p.plateFromOpeningTopIn)}`, size: text * 0.85 });
    }
  });
  const mirrored = d.hingeSide === 'right' ? shapes.map((s) => mirrorX(s, 0)) : shapes;
  const framed = frame(mirrored, text * 1.5);
  return {
    kind: 'hinge-overview',
    title: `Door ${n}: hinges and mounting plates`,
    scale: 'to-scale',
    ...framed,
    missing: d.missing,
    notes: [
      `Cup centres ${templateLength(d.cupCentreFromDoorEdgeIn, plan.units)} from the hinge edge; plate centre line ${templateLength(d.plateSetbackIn, plan.units)} from the front edge of the ${sideName(d.mountsOn)}.`,
      ...(panelDepth === null ? ['Enclosure depth not known: the side panel is drawn as a short strip.'] : []),
    ],
    caution: DRAWING_CAUTION,
  };
}

function templateDrawing(units: UnitSystem, d: LayoutBase, assumptions: string[]): Drawing {
  const { width: W, height: H } = TEMPLATE_SHEET_IN;
  const n = d.doorIndex + 1;
  const L = (inches: number) => templateLength(inches, units);
  const shapes: Shape[] = [];
  const margin = 0.3;

  shapes.push({ kind: 'text', role: 'label', at: [margin, 0.45], text: `Door ${n}: hinge drilling template, full size`, size: 0.17, anchor: 'start', weight: 'bold' });
  shapes.push({ kind: 'text', role: 'note', at: [margin, 0.68], text: 'Print at 100 % (actual size), not "fit to page". Check the bar before drilling.', size: 0.1, anchor: 'start' });

  // Scale check: ten 10 mm blocks, alternately filled.
  const barLength = mmToInches(SCALE_CHECK_MM);
  const block = barLength / 10;
  shapes.push({ kind: 'rect', role: 'scale-bar-outline', x: margin, y: 0.82, width: barLength, height: 0.09 });
  for (let i = 0; i < 10; i += 2) {
    shapes.push({ kind: 'rect', role: 'scale-bar', x: margin + i * block, y: 0.82, width: block, height: 0.09 });
  }
  shapes.push({ kind: 'dimension', role: 'dimension', from: [margin, 0.91], to: [margin + barLength, 0.91], offset: -0.12, valueIn: barLength, label: `this bar must measure ${SCALE_CHECK_MM} mm`, size: 0.1 });

  const detail: Shape[] = [];
  const top = 1.55;
  const bottomY = 5.05;
  const markY = 3.3;
  const doorEdge = 3.15;
  const panelFront = 3.85;
  const cupX = doorEdge - d.cupCentreFromDoorEdgeIn;
  const r = cupRadiusIn;

  detail.push({ kind: 'rect', role: 'door', x: margin, y: top, width: doorEdge - margin, height: bottomY - top });
  detail.push({ kind: 'text', role: 'label', at: [margin + 0.08, top - 0.1], text: `Door ${n}, back face`, size: 0.11, anchor: 'start', weight: 'bold' });
  detail.push({ kind: 'text', role: 'note', at: [doorEdge - 0.05, top + 0.18], text: 'hinge edge', size: 0.09, anchor: 'end' });
  detail.push({ kind: 'line', role: 'centre-line', from: [margin, markY], to: [doorEdge, markY] });
  detail.push({ kind: 'text', role: 'note', at: [margin + 0.08, markY - 0.06], text: 'hinge mark', size: 0.09, anchor: 'start' });
  detail.push({ kind: 'circle', role: 'cup', centre: [cupX, markY], radius: r });
  detail.push({ kind: 'line', role: 'centre-line', from: [cupX, markY - r - 0.15], to: [cupX, markY + r + 0.15] });
  detail.push({ kind: 'text', role: 'label', at: [cupX - r - 0.08, markY + 0.3], text: `${CUP_DIAMETER_MM} mm cup`, size: 0.1, anchor: 'end' });
  detail.push({ kind: 'dimension', role: 'dimension', from: [cupX, markY], to: [doorEdge, markY], offset: -(r + 0.3), valueIn: d.cupCentreFromDoorEdgeIn, label: `${L(d.cupCentreFromDoorEdgeIn)} to cup centre`, size: 0.09 });
  const bore = d.cupBoringDistanceIn;
  detail.push({ kind: 'dimension', role: 'dimension', from: [doorEdge - bore, markY], to: [doorEdge, markY], offset: r + 0.25, valueIn: bore, label: `boring ${Number(inchesToMm(bore).toFixed(1))} mm`, size: 0.09 });

  const plateX = panelFront + d.plateSetbackIn;
  const half = plateHoleSpacingIn / 2;
  detail.push({ kind: 'rect', role: 'panel', x: panelFront, y: top, width: W - margin - panelFront, height: bottomY - top });
  detail.push({ kind: 'text', role: 'label', at: [panelFront + 0.08, top - 0.1], text: `${sideName(d.mountsOn)[0].toUpperCase()}${sideName(d.mountsOn).slice(1)}, inside face`, size: 0.11, anchor: 'start', weight: 'bold' });
  detail.push({ kind: 'text', role: 'note', at: [panelFront + 0.05, top + 0.18], text: 'front edge', size: 0.09, anchor: 'start' });
  detail.push({ kind: 'line', role: 'centre-line', from: [panelFront, markY], to: [W - margin, markY] });
  detail.push({ kind: 'line', role: 'centre-line', from: [plateX, top + 0.3], to: [plateX, bottomY - 0.1], dashed: true });
  const plateW = mmToInches(PLATE_FOOTPRINT_MM.width);
  const plateH = mmToInches(PLATE_FOOTPRINT_MM.height);
  detail.push({ kind: 'rect', role: 'plate', x: plateX - plateW / 2, y: markY - plateH / 2, width: plateW, height: plateH, dashed: true });
  for (const dy of [-half, half]) {
    detail.push({ kind: 'circle', role: 'hole', centre: [plateX, markY + dy], radius: mmToInches(HOLE_MARK_MM) });
    detail.push({ kind: 'line', role: 'centre-line', from: [plateX - 0.1, markY + dy], to: [plateX + 0.1, markY + dy] });
  }
  detail.push({ kind: 'dimension', role: 'dimension', from: [panelFront, markY], to: [plateX, markY], offset: plateH / 2 + 0.35, valueIn: d.plateSetbackIn, label: `${L(d.plateSetbackIn)} to plate centre`, size: 0.09 });
  detail.push({ kind: 'dimension', role: 'dimension', from: [plateX, markY - half], to: [plateX, markY + half], offset: -0.3, valueIn: plateHoleSpacingIn, label: `${PLATE_HOLE_SPACING_MM} mm`, size: 0.09 });
  detail.push({ kind: 'text', role: 'note', at: [plateX + 0.15, markY + plateH / 2 + 0.25], text: 'plate outline varies by maker', size: 0.09, anchor: 'start' });

  // A right-hinged door is seen from inside the closet with its hinge edge on the left.
  shapes.push(...(d.hingeSide === 'right' ? detail.map((s) => mirrorX(s, W / 2)) : detail));

  // The position table: the plan's positions restated from the top, for a tape measure.
  let rowY = 5.65;
  const columns = [margin, 0.95, 2.55, 4.15, 5.6];
  const headers = ['Hinge', 'Cup centre from door top', 'Plate from top of opening', 'Plate from top of panel', 'Plate from front edge'];
  headers.forEach((h, i) => shapes.push({ kind: 'text', role: 'label', at: [columns[i], rowY], text: h, size: 0.09, anchor: 'start', weight: 'bold' }));
  shapes.push({ kind: 'line', role: 'dimension', from: [margin, rowY + 0.06], to: [W - margin, rowY + 0.06] });
  const rowStep = Math.min(0.22, 1.7 / Math.max(1, d.positions.length));
  const rowSize = Math.min(0.1, rowStep * 0.5);
  const value = (v: number | null) => (v === null ? 'not known' : L(v));
  for (const p of d.positions) {
    rowY += rowStep;
    const cells = [String(p.number), value(p.fromDoorTopIn), value(p.plateFromOpeningTopIn), value(p.plateFromPanelTopIn), L(d.plateSetbackIn)];
    cells.forEach((c, i) => shapes.push({ kind: 'text', role: 'label', at: [columns[i], rowY], text: c, size: rowSize, anchor: 'start' }));
  }
  if (d.positions.length === 0) {
    rowY += rowStep;
    shapes.push({ kind: 'text', role: 'note', at: [margin, rowY], text: 'No hinge positions in the plan.', size: 0.09, anchor: 'start' });
  }

  let noteY = 7.85;
  for (const paragraph of [...assumptions, DRAWING_CAUTION]) {
    for (const line of wrapText(paragraph, 0.095, W - margin * 2)) {
      shapes.push({ kind: 'text', role: 'note', at: [margin, noteY], text: line, size: 0.095, anchor: 'start' });
      noteY += 0.145;
    }
    noteY += 0.05;
  }

  return {
    kind: 'hinge-template',
    title: `Door ${n}: drilling template (full size)`,
    scale: 'full-size',
    width: W,
    height: H,
    shapes,
    missing: d.missing,
    notes: [],
    caution: DRAWING_CAUTION,
  };
}
