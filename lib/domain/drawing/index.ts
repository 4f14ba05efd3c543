export * from '@/lib/domain/drawing/shapes';
export * from '@/lib/domain/drawing/constants';
export { toMarks, markNotes, type Mark, type MarkSource } from '@/lib/domain/drawing/marks';
export { closetLayout, type ClosetLayout, type DoorBox, type UnitBox } from '@/lib/domain/drawing/layout';
export { frontElevation, type DrawingOptions } from '@/lib/domain/drawing/front-elevation';
export { planView } from '@/lib/domain/drawing/plan-view';
export { exhaustSchematic, type ExhaustSchematic, type ExhaustSegment } from '@/lib/domain/drawing/exhaust-schematic';
export { hingeLayouts, type DoorHingeLayout, type HingePosition } from '@/lib/domain/drawing/hinge-layout';
export { drawPlan, countDrawingElements, DRAWING_ELEMENT_BUDGET, type PlanDrawings, type DrawPlanResult } from '@/lib/domain/drawing/budget';
