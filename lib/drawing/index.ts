export * from './shapes';
export * from './constants';
export { toMarks, markNotes, type Mark, type MarkSource } from './marks';
export { closetLayout, type ClosetLayout, type DoorBox, type UnitBox } from './layout';
export { frontElevation, type DrawingOptions } from './front-elevation';
export { planView } from './plan-view';
export { exhaustSchematic, type ExhaustSchematic, type ExhaustSegment } from './exhaust-schematic';
export { hingeLayouts, type DoorHingeLayout, type HingePosition } from './hinge-layout';
export { drawPlan, countDrawingElements, DRAWING_ELEMENT_BUDGET, type PlanDrawings, type DrawPlanResult } from './budget';
