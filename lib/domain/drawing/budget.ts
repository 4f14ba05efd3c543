import { findOversizeLists, type Plan } from '@/lib/domain/plan';
import { exhaustSchematic, type ExhaustSchematic } from '@/lib/domain/drawing/exhaust-schematic';
import { frontElevation, type DrawingOptions } from '@/lib/domain/drawing/front-elevation';
import { hingeLayouts, type DoorHingeLayout } from '@/lib/domain/drawing/hinge-layout';
import { planView } from '@/lib/domain/drawing/plan-view';
import type { Drawing, Shape } from '@/lib/domain/drawing/shapes';

/**
 * The most drawing elements (shapes, plus the points of polylines) one plan may produce across all of
 * its drawings. The largest plan the schema allows makes about 2,100 (tests/unit/drawing-budget.test.ts);
 * the budget leaves room above that, so a drawing change that multiplies the output is refused, not served.
 */
export const DRAWING_ELEMENT_BUDGET = 5_000;

export interface PlanDrawings {
  elevation: Drawing;
  planView: Drawing;
  exhaust: ExhaustSchematic;
  hinges: DoorHingeLayout[];
}

export type DrawPlanResult = { ok: true; drawings: PlanDrawings; elements: number } | { ok: false; reasons: string[] };

function elementsOf(shapes: readonly Shape[]): number {
  return shapes.reduce((n, s) => n + (s.kind === 'polyline' ? 1 + s.points.length : 1), 0);
}

export function countDrawingElements(drawings: PlanDrawings): number {
  const all: Drawing[] = [drawings.elevation, drawings.planView, drawings.exhaust, ...drawings.hinges.flatMap((h) => [h.overview, h.template])];
  return all.reduce((n, d) => n + elementsOf(d.shapes), 0);
}

/**
 * Every drawing of a plan, or the reasons it is not drawn: a list longer than the plan limits (a stored
 * revision from before them) is refused before any geometry is made, and the finished geometry must fit
 * the element budget. The web page and the PDF report both draw through here.
 */
export function drawPlan(plan: Plan, options: DrawingOptions, budget = DRAWING_ELEMENT_BUDGET): DrawPlanResult {
  const oversize = findOversizeLists(plan);
  if (oversize.length > 0) return { ok: false, reasons: oversize.map((o) => o.message) };
  const drawings: PlanDrawings = {
    elevation: frontElevation(plan, options),
    planView: planView(plan, options),
    exhaust: exhaustSchematic(plan, options),
    hinges: hingeLayouts(plan, options),
  };
  const elements = countDrawingElements(drawings);
  if (elements > budget) {
    return { ok: false, reasons: [`The drawings would have ${elements.toLocaleString('en-US')} elements; the most NookPass draws for one plan is ${budget.toLocaleString('en-US')}.`] };
  }
  return { ok: true, drawings, elements };
}
