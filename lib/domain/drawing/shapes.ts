import type { PlanFieldPath } from '@/lib/domain/plan';
/**
 * Drawings as plain data, so the web SVG and a later PDF renderer draw the same geometry.
 *
 * Coordinates are inches with the origin at the top-left of the drawing and y pointing down
 * (the convention of both SVG and PDF page space). Text sizes are in the same inches; a
 * renderer scales the whole drawing uniformly, except a `full-size` drawing, which it prints
 * at exactly width × height inches.
 */

export type Point = readonly [number, number];

/** A finding that did not pass: `fail` from a fail-severity rule, `caution` from a caution one. */
export type MarkStatus = 'fail' | 'caution';

export type ShapeRole =
  | 'enclosure'
  | 'panel'
  | 'floor'
  | 'toe-kick'
  | 'washer'
  | 'dryer'
  | 'appliance-front'
  | 'appliance-detail'
  | 'clearance'
  | 'clearance-fail'
  | 'rear-zone'
  | 'hinge-arm-zone'
  | 'door'
  | 'door-swing'
  | 'duct'
  | 'transition'
  | 'fitting'
  | 'over-limit'
  | 'limit'
  | 'hinge'
  | 'cup'
  | 'plate'
  | 'hole'
  | 'centre-line'
  | 'dimension'
  | 'label'
  | 'note'
  | 'scale-bar'
  | 'scale-bar-outline'
  | 'status-mark';

interface ShapeBase {
  role: ShapeRole;
  /** Set where the shape shows something a finding did not pass. */
  status?: MarkStatus;
  /** The rule the shape illustrates, so a renderer can link to the finding. */
  ruleKey?: string;
  /** Dashed outline: hidden or assumed edges (doors drawn over the units, stacked units). */
  dashed?: boolean;
}

export interface RectShape extends ShapeBase {
  kind: 'rect';
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface LineShape extends ShapeBase {
  kind: 'line';
  from: Point;
  to: Point;
}

export interface PolylineShape extends ShapeBase {
  kind: 'polyline';
  points: Point[];
  closed: boolean;
}

/** A circular arc; angles in degrees clockwise on the page from +x (y points down). */
export interface ArcShape extends ShapeBase {
  kind: 'arc';
  centre: Point;
  radius: number;
  startDeg: number;
  endDeg: number;
}

export interface CircleShape extends ShapeBase {
  kind: 'circle';
  centre: Point;
  radius: number;
}

export interface TextShape extends ShapeBase {
  kind: 'text';
  /** Baseline point. */
  at: Point;
  text: string;
  size: number;
  anchor: 'start' | 'middle' | 'end';
  weight?: 'normal' | 'bold';
}

/**
 * A measured distance between two points. The dimension line runs parallel to from→to,
 * `offset` inches to the left of that direction as seen on the page (so a left-to-right
 * dimension with a positive offset sits above the points). The label is already formatted in
 * the plan's units.
 */
export interface DimensionShape extends ShapeBase {
  kind: 'dimension';
  from: Point;
  to: Point;
  offset: number;
  valueIn: number;
  label: string;
  size: number;
}

/** One of our status symbols (square with a cross for fail, triangle for caution) at a point. */
export interface MarkShape extends ShapeBase {
  kind: 'mark';
  at: Point;
  size: number;
  status: MarkStatus;
}

export type Shape =
  | RectShape
  | LineShape
  | PolylineShape
  | ArcShape
  | CircleShape
  | TextShape
  | DimensionShape
  | MarkShape;

export type DrawingKind = 'front-elevation' | 'plan-view' | 'exhaust-schematic' | 'hinge-overview' | 'hinge-template';

export interface Drawing {
  kind: DrawingKind;
  title: string;
  /** `to-scale`: proportions true, shown at any size; `schematic`: not to scale; `full-size`: print at width × height inches. */
  scale: 'to-scale' | 'schematic' | 'full-size';
  width: number;
  height: number;
  shapes: Shape[];
  /** Plan fields the drawing needed and did not find (paths such as `enclosure.depth`). */
  missing: string[];
  /** Assumptions and findings the reader should see next to the drawing. */
  notes: string[];
  caution: string;
}

export const DRAWING_CAUTION =
  "Dimensions from the plan; verify on site. The locally adopted code, the AHJ and the appliance maker's instructions govern.";

// Average advance of a sans-serif glyph as a share of its size; only used to keep labels inside the frame.
const GLYPH_WIDTH = 0.56;

export function textWidth(text: string, size: number): number {
  return text.length * size * GLYPH_WIDTH;
}

/** Where a dimension's line and label fall; both renderers use this so they agree. */
export function dimensionGeometry(d: DimensionShape): { from: Point; to: Point; labelAt: Point; angleDeg: number } {
  const dx = d.to[0] - d.from[0];
  const dy = d.to[1] - d.from[1];
  const length = Math.hypot(dx, dy) || 1;
  const nx = dy / length;
  const ny = -dx / length;
  const from: Point = [d.from[0] + nx * d.offset, d.from[1] + ny * d.offset];
  const to: Point = [d.to[0] + nx * d.offset, d.to[1] + ny * d.offset];
  let angleDeg = (Math.atan2(dy, dx) * 180) / Math.PI;
  // Keep labels readable: never upside down; vertical labels read bottom to top.
  if (angleDeg >= 90) angleDeg -= 180;
  if (angleDeg < -90) angleDeg += 180;
  const side = d.offset >= 0 ? 1 : -1;
  const gap = d.size * 0.35;
  const mid: Point = [(from[0] + to[0]) / 2, (from[1] + to[1]) / 2];
  // The label sits on the outer side of the line, its baseline `gap` away.
  const outward: Point = [nx * side, ny * side];
  const baselineShift = outward[1] > 0 || (outward[1] === 0 && outward[0] > 0) ? gap + d.size * 0.8 : gap;
  const labelAt: Point = [mid[0] + outward[0] * baselineShift, mid[1] + outward[1] * baselineShift];
  return { from, to, labelAt, angleDeg };
}

interface Box {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

function addPoint(box: Box, [x, y]: Point): void {
  box.minX = Math.min(box.minX, x);
  box.minY = Math.min(box.minY, y);
  box.maxX = Math.max(box.maxX, x);
  box.maxY = Math.max(box.maxY, y);
}

function addText(box: Box, at: Point, text: string, size: number, anchor: TextShape['anchor'], angleDeg = 0): void {
  const width = textWidth(text, size);
  const start = anchor === 'start' ? 0 : anchor === 'middle' ? -width / 2 : -width;
  const rad = (angleDeg * Math.PI) / 180;
  const corners: Point[] = [
    [start, -size],
    [start + width, -size],
    [start, size * 0.25],
    [start + width, size * 0.25],
  ];
  for (const [u, v] of corners) addPoint(box, [at[0] + u * Math.cos(rad) - v * Math.sin(rad), at[1] + u * Math.sin(rad) + v * Math.cos(rad)]);
}

export function boundsOf(shapes: readonly Shape[]): Box | null {
  const box: Box = { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };
  for (const s of shapes) {
    switch (s.kind) {
      case 'rect':
        addPoint(box, [s.x, s.y]);
        addPoint(box, [s.x + s.width, s.y + s.height]);
        break;
      case 'line':
        addPoint(box, s.from);
        addPoint(box, s.to);
        break;
      case 'polyline':
        s.points.forEach((p) => addPoint(box, p));
        break;
      case 'arc':
        for (let i = 0; i <= 16; i += 1) {
          const a = ((s.startDeg + ((s.endDeg - s.startDeg) * i) / 16) * Math.PI) / 180;
          addPoint(box, [s.centre[0] + s.radius * Math.cos(a), s.centre[1] + s.radius * Math.sin(a)]);
        }
        break;
      case 'circle':
        addPoint(box, [s.centre[0] - s.radius, s.centre[1] - s.radius]);
        addPoint(box, [s.centre[0] + s.radius, s.centre[1] + s.radius]);
        break;
      case 'text':
        addText(box, s.at, s.text, s.size, s.anchor);
        break;
      case 'dimension': {
        const g = dimensionGeometry(s);
        addPoint(box, s.from);
        addPoint(box, s.to);
        addPoint(box, g.from);
        addPoint(box, g.to);
        addText(box, g.labelAt, s.label, s.size, 'middle', g.angleDeg);
        break;
      }
      case 'mark':
        addPoint(box, [s.at[0] - s.size / 2, s.at[1] - s.size / 2]);
        addPoint(box, [s.at[0] + s.size / 2, s.at[1] + s.size / 2]);
        break;
    }
  }
  return Number.isFinite(box.minX) ? box : null;
}

function move([x, y]: Point, dx: number, dy: number): Point {
  return [x + dx, y + dy];
}

export function translate(shape: Shape, dx: number, dy: number): Shape {
  switch (shape.kind) {
    case 'rect':
      return { ...shape, x: shape.x + dx, y: shape.y + dy };
    case 'line':
      return { ...shape, from: move(shape.from, dx, dy), to: move(shape.to, dx, dy) };
    case 'polyline':
      return { ...shape, points: shape.points.map((p) => move(p, dx, dy)) };
    case 'arc':
    case 'circle':
      return { ...shape, centre: move(shape.centre, dx, dy) };
    case 'text':
    case 'mark':
      return { ...shape, at: move(shape.at, dx, dy) };
    case 'dimension':
      return { ...shape, from: move(shape.from, dx, dy), to: move(shape.to, dx, dy) };
  }
}

/**
 * Moves shapes drawn in any convenient frame so their bounds start `pad` inches from the
 * top-left, and sizes the drawing to hold them. Translation only: scale is untouched, so a
 * to-scale drawing stays to scale.
 */
export function frame(shapes: Shape[], pad: number): { width: number; height: number; shapes: Shape[] } {
  const box = boundsOf(shapes);
  if (!box) return { width: pad * 2, height: pad * 2, shapes: [] };
  const dx = pad - box.minX;
  const dy = pad - box.minY;
  return {
    width: box.maxX - box.minX + pad * 2,
    height: box.maxY - box.minY + pad * 2,
    shapes: shapes.map((s) => translate(s, dx, dy)),
  };
}

type Need = <T>(path: PlanFieldPath, value: T | null | undefined) => T;

/**
 * Runs a computation the way lib/facts does (a `need` per plan field) but never throws: the
 * value is null when any field was missing, and the missing paths are returned to list.
 */
export function measure<T>(compute: (need: Need) => T): { value: T | null; missing: PlanFieldPath[] } {
  const missing: PlanFieldPath[] = [];
  const need: Need = (path, value) => {
    if (value === undefined || value === null) missing.push(path);
    return value as never;
  };
  let value: T | null = null;
  try {
    value = compute(need);
  } catch (error) {
    if (missing.length === 0) throw error;
  }
  if (missing.length > 0) return { value: null, missing: [...new Set(missing)] };
  if (typeof value === 'number' && !Number.isFinite(value)) return { value: null, missing: [] };
  return { value, missing: [] };
}

/** Collects missing plan paths across a drawing, in first-seen order. */
export class MissingList {
  private readonly paths = new Set<PlanFieldPath>();

  add(paths: readonly PlanFieldPath[]): void {
    paths.forEach((p) => this.paths.add(p));
  }

  /** `value` if present, otherwise records `path` and returns undefined. */
  take<T>(path: PlanFieldPath, value: T | null | undefined): T | undefined {
    if (value === undefined || value === null) {
      this.paths.add(path);
      return undefined;
    }
    return value;
  }

  list(): PlanFieldPath[] {
    return [...this.paths];
  }
}

function flip([x, y]: Point, axis: number): Point {
  return [2 * axis - x, y];
}

/**
 * Mirrors a shape about the vertical line x = axis, for the right-hand version of a detail.
 * Text keeps reading left to right (only its anchor flips); a dimension keeps its side of the
 * line, so its offset changes sign with the mirrored direction.
 */
export function mirrorX(shape: Shape, axis: number): Shape {
  switch (shape.kind) {
    case 'rect':
      return { ...shape, x: 2 * axis - shape.x - shape.width };
    case 'line':
      return { ...shape, from: flip(shape.from, axis), to: flip(shape.to, axis) };
    case 'polyline':
      return { ...shape, points: shape.points.map((p) => flip(p, axis)) };
    case 'arc':
      return { ...shape, centre: flip(shape.centre, axis), startDeg: 180 - shape.endDeg, endDeg: 180 - shape.startDeg };
    case 'circle':
      return { ...shape, centre: flip(shape.centre, axis) };
    case 'text': {
      const anchor = shape.anchor === 'start' ? 'end' : shape.anchor === 'end' ? 'start' : 'middle';
      return { ...shape, at: flip(shape.at, axis), anchor };
    }
    case 'mark':
      return { ...shape, at: flip(shape.at, axis) };
    case 'dimension':
      return { ...shape, from: flip(shape.from, axis), to: flip(shape.to, axis), offset: -shape.offset };
  }
}

/** Breaks text into lines no wider than `maxWidth` at `size`, for renderers that do not wrap. */
export function wrapText(text: string, size: number, maxWidth: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter(Boolean)) {
    const candidate = line ? `${line} ${word}` : word;
    if (line && textWidth(candidate, size) > maxWidth) {
      lines.push(line);
      line = word;
    } else {
      line = candidate;
    }
  }
  if (line) lines.push(line);
  return lines;
}
