import { computeFactsWithMissing, fittingEquivalentIn } from '@/lib/domain/facts';
import type { FittingKind, Plan, PlanFieldPath, RunItem } from '@/lib/domain/plan';
import { formatLength } from '@/lib/domain/units';
import type { DrawingOptions } from '@/lib/domain/drawing/front-elevation';
import { markNotes, toMarks } from '@/lib/domain/drawing/marks';
import { DRAWING_CAUTION, frame, type Drawing, type Point, type Shape } from '@/lib/domain/drawing/shapes';

export interface ExhaustSegment {
  /** Position in plan.exhaust.run. */
  index: number;
  kind: 'straight' | 'elbow';
  description: string;
  /** What the segment counts toward the developed length: its length, or the elbow's table equivalent. */
  equivalentIn: number;
  startIn: number;
  runningTotalIn: number;
}

export interface ExhaustSchematic extends Drawing {
  kind: 'exhaust-schematic';
  segments: ExhaustSegment[];
  transitionLengthIn: number | null;
  /** exhaust.developedLengthIn from lib/facts; null without a run. */
  developedLengthIn: number | null;
  allowedLengthIn: number;
  allowedLengthSource: string;
  /** How far the developed length exceeds the allowed length; 0 when within it, null when unknown. */
  overByIn: number | null;
}

const FITTING_NAMES: Record<FittingKind, string> = {
  mitered: '4-in radius mitered',
  'smooth-6in': '6-in radius smooth',
  'smooth-8in': '8-in radius smooth',
  'smooth-10in': '10-in radius smooth',
  other: 'other kind, counted as 4-in radius mitered',
};

const SOURCE_NAMES: Record<string, string> = {
  code: 'code maximum',
  manufacturer: "dryer maker's maximum",
  'power-ventilator': "power ventilator's maximum",
};

const EXHAUST_RULES = ['exhaust.developed-length', 'exhaust.transition-length', 'exhaust.transition-concealed'];

function describe(item: RunItem): string {
  if (item.elbow === undefined) return 'Straight';
  const fitting = item.fitting === undefined ? 'kind not given, counted as 4-in radius mitered' : FITTING_NAMES[item.fitting];
  return `${item.elbow}° elbow, ${fitting}`;
}

/** A listed condensing or heat-pump dryer has no route to draw, and none is asked for. */
function ventlessSchematic(allowed: number): ExhaustSchematic {
  const text = 1;
  const shapes: Shape[] = [
    {
      kind: 'text',
      role: 'note',
      at: [0, text * 1.5],
      text: 'No exhaust duct: a listed condensing or heat-pump dryer needs none (IRC M1502.2 exception).',
      size: text,
      anchor: 'start',
    },
  ];
  return {
    kind: 'exhaust-schematic',
    title: 'Exhaust route and developed length',
    scale: 'schematic',
    ...frame(shapes, text * 1.5),
    missing: [],
    notes: ["Follow the dryer maker's instructions for its condensate drain or reservoir and its closet clearances."],
    caution: DRAWING_CAUTION,
    segments: [],
    transitionLengthIn: null,
    developedLengthIn: null,
    allowedLengthIn: allowed,
    allowedLengthSource: 'code',
    overByIn: null,
  };
}

/**
 * The exhaust route as a ladder: one row per piece, in order from the transition connection,
 * each bar as long as what the piece counts, starting where the previous one ended. Along x the
 * bars are to scale in equivalent length; rows and glyphs are schematic.
 */
export function exhaustSchematic(plan: Plan, options: DrawingOptions): ExhaustSchematic {
  const { params } = options;
  const marks = toMarks(options.marks);
  const { facts, missing: factMissing } = computeFactsWithMissing(plan, params);
  const fmt = (inches: number) => formatLength(inches, plan.units);
  if (facts['exhaust.ductRequired'] === false) return ventlessSchematic(facts['exhaust.allowedLengthIn'] as number);
  const exhaust = plan.exhaust;
  const run = exhaust?.run ?? [];
  const missing: PlanFieldPath[] = [];
  if (run.length === 0) missing.push(...(factMissing['exhaust.developedLengthIn'] ?? ['exhaust.run']));
  const transition = exhaust?.transition?.length ?? null;
  if (transition === null) missing.push('exhaust.transition.length');

  // Summed in the same order and the same way as exhaust.developedLengthIn, so the last running
  // total is the fact itself (which lib/facts may also trim of float noise).
  let running = 0;
  const segments: ExhaustSegment[] = run.map((item, index) => {
    const equivalentIn = (item.straight ?? 0) + fittingEquivalentIn(item, params);
    const startIn = running;
    running = running + equivalentIn;
    return { index, kind: item.elbow === undefined ? 'straight' : 'elbow', description: describe(item), equivalentIn, startIn, runningTotalIn: running };
  });
  const developed = facts['exhaust.developedLengthIn'] as number | null;
  if (developed !== null && segments.length > 0) segments[segments.length - 1].runningTotalIn = developed;
  const allowed = facts['exhaust.allowedLengthIn'] as number;
  const source = (facts['exhaust.allowedLengthSource'] as string | null) ?? 'code';
  const overBy = developed === null ? null : Math.max(0, developed - allowed);

  const span = Math.max(developed ?? 0, allowed, transition ?? 0, 12);
  const row = span / 14;
  const text = row * 0.4;
  const labelWidth = span * 0.62;
  const x0 = labelWidth;
  const bar = row * 0.5;
  const shapes: Shape[] = [];
  const lengthMark = marks.get('exhaust.developed-length');
  const transitionMark = marks.get('exhaust.transition-length') ?? marks.get('exhaust.transition-concealed');

  let y = row;
  shapes.push({ kind: 'text', role: 'label', at: [0, y - row * 0.2], text: 'Piece, in order from the dryer', size: text * 0.85, anchor: 'start', weight: 'bold' });
  shapes.push({ kind: 'text', role: 'label', at: [x0, y - row * 0.2], text: 'Counted length (to scale)', size: text * 0.85, anchor: 'start', weight: 'bold' });

  // The transition duct is drawn but never counted (IRC 2018 M1502.4.5.1 / 2021 M1502.4.6.1).
  y += row;
  glyph(shapes, 'transition', [text * 0.2, y - bar / 2], row * 0.7);
  shapes.push({ kind: 'text', role: 'label', at: [row, y], text: transition === null ? 'Transition duct, length not given' : `Transition duct ${fmt(transition)}`, size: text, anchor: 'start', status: transitionMark?.status });
  if (transition !== null) {
    shapes.push({ kind: 'rect', role: 'transition', x: x0, y: y - bar * 0.8, width: transition, height: bar * 0.6, dashed: true, status: transitionMark?.status });
  }
  shapes.push({ kind: 'text', role: 'note', at: [x0 + (transition ?? 0) + text * 0.6, y], text: 'not counted', size: text * 0.9, anchor: 'start' });
  if (transitionMark) shapes.push({ kind: 'mark', role: 'status-mark', at: [row * 0.5 + text * 0.2 - row, y - text * 0.35], size: text, status: transitionMark.status });

  for (const segment of segments) {
    y += row;
    glyph(shapes, segment.kind === 'straight' ? 'straight' : run[segment.index].elbow === 45 ? 'elbow-45' : 'elbow-90', [text * 0.2, y - bar / 2], row * 0.7);
    const piece = segment.kind === 'straight' ? `${segment.index + 1}. Straight ${fmt(segment.equivalentIn)}` : `${segment.index + 1}. ${segment.description} counts ${fmt(segment.equivalentIn)}`;
    shapes.push({ kind: 'text', role: 'label', at: [row, y], text: piece, size: text, anchor: 'start' });
    const role = segment.kind === 'straight' ? 'duct' : 'fitting';
    const within = Math.max(0, Math.min(segment.runningTotalIn, allowed) - segment.startIn);
    if (within > 0) shapes.push({ kind: 'rect', role, x: x0 + segment.startIn, y: y - bar, width: within, height: bar });
    const over = segment.equivalentIn - within;
    if (over > 1e-9) shapes.push({ kind: 'rect', role: 'over-limit', status: 'fail', ruleKey: 'exhaust.developed-length', x: x0 + segment.startIn + within, y: y - bar, width: over, height: bar });
    shapes.push({ kind: 'text', role: 'label', at: [x0 + segment.runningTotalIn + text * 0.6, y - bar * 0.15], text: `total ${fmt(segment.runningTotalIn)}`, size: text * 0.85, anchor: 'start' });
  }

  y += row * 1.3;
  const totalStatus = lengthMark?.status ?? (overBy !== null && overBy > 0 ? 'fail' : undefined);
  shapes.push({ kind: 'text', role: 'label', at: [row, y], text: developed === null ? 'Developed length: route not given' : `Developed length ${fmt(developed)}`, size: text, anchor: 'start', weight: 'bold', status: totalStatus });
  if (developed !== null) {
    const within = Math.min(developed, allowed);
    if (within > 0) shapes.push({ kind: 'rect', role: 'duct', x: x0, y: y - bar, width: within, height: bar });
    if (developed > allowed) shapes.push({ kind: 'rect', role: 'over-limit', status: 'fail', ruleKey: 'exhaust.developed-length', x: x0 + allowed, y: y - bar, width: developed - allowed, height: bar });
    shapes.push({ kind: 'dimension', role: 'dimension', status: totalStatus, ruleKey: 'exhaust.developed-length', from: [x0, y], to: [x0 + developed, y], offset: -text * 1.4, valueIn: developed, label: `developed length ${fmt(developed)}`, size: text * 0.85 });
  }
  if (totalStatus) shapes.push({ kind: 'mark', role: 'status-mark', at: [row * 0.4, y - text * 0.35], size: text, status: totalStatus, ruleKey: 'exhaust.developed-length' });

  // The allowed length as a limit line across every row.
  const limitX = x0 + allowed;
  shapes.push({ kind: 'line', role: 'limit', from: [limitX, row * 1.2], to: [limitX, y + text * 0.6] });
  shapes.push({ kind: 'text', role: 'label', at: [limitX, row * 1.05], text: `allowed ${fmt(allowed)} (${SOURCE_NAMES[source] ?? source})`, size: text * 0.85, anchor: 'middle' });
  y += row * 1.2;
  const verdict =
    overBy === null
      ? 'Add the route to compare it with the allowed length.'
      : overBy > 0
        ? `Over the allowed ${fmt(allowed)} by ${fmt(overBy)}.`
        : `Within the allowed ${fmt(allowed)}, ${fmt(allowed - (developed as number))} to spare.`;
  shapes.push({ kind: 'text', role: overBy !== null && overBy > 0 ? 'over-limit' : 'note', status: overBy !== null && overBy > 0 ? 'fail' : undefined, at: [row, y], text: verdict, size: text, anchor: 'start' });

  const notes = ['The transition duct is not counted in the developed length (IRC 2018 M1502.4.5.1; 2021 M1502.4.6.1).'];
  if (run.some((item) => item.elbow !== undefined && (item.fitting === undefined || item.fitting === 'other'))) {
    notes.push('Elbows of a kind outside the fitting table are counted as 4-in radius mitered (conservative; common practice).');
  }
  const framed = frame(shapes, text * 1.5);
  return {
    kind: 'exhaust-schematic',
    title: 'Exhaust route and developed length',
    scale: 'schematic',
    ...framed,
    missing,
    notes: [...notes, ...markNotes(marks, EXHAUST_RULES)],
    caution: DRAWING_CAUTION,
    segments,
    transitionLengthIn: transition,
    developedLengthIn: developed,
    allowedLengthIn: allowed,
    allowedLengthSource: source,
    overByIn: overBy,
  };
}

/** Our glyph for each piece: a bar, a bent bar, or a wavy line for the flexible transition. */
function glyph(shapes: Shape[], kind: 'straight' | 'elbow-90' | 'elbow-45' | 'transition', [x, yMid]: Point, size: number): void {
  const h = size * 0.5;
  if (kind === 'straight') {
    shapes.push({ kind: 'polyline', role: 'duct', points: [[x, yMid], [x + size, yMid]], closed: false });
  } else if (kind === 'elbow-90') {
    shapes.push({ kind: 'polyline', role: 'fitting', points: [[x, yMid - h / 2], [x + size * 0.5, yMid - h / 2], [x + size * 0.5, yMid + h]], closed: false });
  } else if (kind === 'elbow-45') {
    shapes.push({ kind: 'polyline', role: 'fitting', points: [[x, yMid], [x + size * 0.45, yMid], [x + size * 0.8, yMid + h * 0.8]], closed: false });
  } else {
    const points: Point[] = [];
    for (let i = 0; i <= 8; i += 1) points.push([x + (size * i) / 8, yMid + (i % 2 === 0 ? -h / 3 : h / 3)]);
    shapes.push({ kind: 'polyline', role: 'transition', points, closed: false });
  }
}
