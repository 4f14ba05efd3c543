import type { MarkStatus, ShapeRole } from '@/lib/domain/drawing';

/**
 * How each role looks on screen and paper, in the palette of tailwind.config.ts. Weights and
 * dashes are in multiples of the drawing's line unit, so a scaled drawing and a full-size sheet
 * keep the same look.
 */
export interface RoleStyle {
  fill: string;
  stroke: string;
  weight: number;
  dash?: number[];
  /** Hatch pattern used instead of a flat fill. */
  hatch?: HatchName;
  /** Text colour for labels with this role. */
  text?: string;
  /** Fill opacity, for zones laid over the units. */
  fillOpacity?: number;
}

export type HatchName = 'zone' | 'kick' | 'transition' | 'fail' | 'caution';

export const hatchStroke: Record<HatchName, string> = {
  zone: 'stroke-brass',
  kick: 'stroke-ink-faint',
  transition: 'stroke-ink-faint',
  fail: 'stroke-status-fail',
  caution: 'stroke-status-caution',
};

export const roleStyle: Record<ShapeRole, RoleStyle> = {
  enclosure: { fill: 'fill-none', stroke: 'stroke-ink', weight: 2.4 },
  panel: { fill: 'fill-paper-deep', stroke: 'stroke-ink', weight: 1 },
  floor: { fill: 'fill-none', stroke: 'stroke-ink-soft', weight: 1.6 },
  'toe-kick': { fill: 'fill-paper', stroke: 'stroke-ink-soft', weight: 1, hatch: 'kick' },
  washer: { fill: 'fill-white', stroke: 'stroke-ink', weight: 1.6 },
  dryer: { fill: 'fill-paper', stroke: 'stroke-ink', weight: 1.6 },
  'appliance-front': { fill: 'fill-paper-deep', stroke: 'stroke-ink-soft', weight: 1 },
  'appliance-detail': { fill: 'fill-none', stroke: 'stroke-ink-faint', weight: 1 },
  clearance: { fill: 'fill-brass-soft', fillOpacity: 0.85, stroke: 'stroke-brass', weight: 0.8, dash: [4, 3] },
  'clearance-fail': { fill: 'fill-white', stroke: 'stroke-status-fail', weight: 1.4, hatch: 'fail' },
  'rear-zone': { fill: 'fill-white', stroke: 'stroke-brass', weight: 0.9, dash: [6, 3], hatch: 'zone' },
  'hinge-arm-zone': { fill: 'fill-ink-faint', fillOpacity: 0.14, stroke: 'stroke-ink-soft', weight: 0.9, dash: [1, 2] },
  door: { fill: 'fill-white', stroke: 'stroke-ink-soft', weight: 1.3 },
  'door-swing': { fill: 'fill-none', stroke: 'stroke-ink-faint', weight: 0.9 },
  duct: { fill: 'fill-ink-soft', stroke: 'stroke-ink-soft', weight: 1.6 },
  transition: { fill: 'fill-white', stroke: 'stroke-ink-faint', weight: 1.2, dash: [3, 2], hatch: 'transition' },
  fitting: { fill: 'fill-brass', stroke: 'stroke-brass', weight: 1.6 },
  'over-limit': { fill: 'fill-status-fail', stroke: 'stroke-status-fail', weight: 1, text: 'fill-status-fail' },
  limit: { fill: 'fill-none', stroke: 'stroke-ink', weight: 1.6, dash: [8, 3, 2, 3] },
  hinge: { fill: 'fill-none', stroke: 'stroke-ink', weight: 2.4 },
  cup: { fill: 'fill-white', stroke: 'stroke-ink', weight: 1.2 },
  plate: { fill: 'fill-brass-soft', stroke: 'stroke-brass', weight: 1 },
  hole: { fill: 'fill-none', stroke: 'stroke-ink', weight: 1 },
  'centre-line': { fill: 'fill-none', stroke: 'stroke-ink-faint', weight: 0.7 },
  dimension: { fill: 'fill-none', stroke: 'stroke-ink-faint', weight: 0.7, text: 'fill-ink-soft' },
  label: { fill: 'fill-none', stroke: 'stroke-none', weight: 0, text: 'fill-ink' },
  note: { fill: 'fill-none', stroke: 'stroke-none', weight: 0, text: 'fill-ink-soft' },
  'scale-bar': { fill: 'fill-ink', stroke: 'stroke-ink', weight: 0.6 },
  'scale-bar-outline': { fill: 'fill-white', stroke: 'stroke-ink', weight: 1 },
  'status-mark': { fill: 'fill-none', stroke: 'stroke-none', weight: 0 },
};

export const statusStroke: Record<MarkStatus, string> = { fail: 'stroke-status-fail', caution: 'stroke-status-caution' };
export const statusFill: Record<MarkStatus, string> = { fail: 'fill-status-fail', caution: 'fill-status-caution' };

/** Legend wording; roles without an entry (labels, notes) are not listed. */
export const roleLegend: Partial<Record<ShapeRole, string>> = {
  enclosure: 'Enclosure outline',
  panel: 'Panels',
  'toe-kick': 'Toe kick',
  washer: 'Washer',
  dryer: 'Dryer',
  'appliance-front': 'Knobs and appliance door',
  clearance: "Maker's clearance",
  'clearance-fail': 'Clearance not met',
  'rear-zone': 'Rear zone for vent, hoses and cord',
  'hinge-arm-zone': 'Room wanted for hinge arms',
  door: 'Enclosure door',
  'door-swing': 'Door swing or travel',
  duct: 'Straight duct',
  transition: 'Transition duct (not counted)',
  fitting: 'Elbow, at its table equivalent',
  'over-limit': 'Beyond the allowed length',
  limit: 'Allowed length',
  hinge: 'Hinge',
  cup: '35 mm hinge cup',
  plate: 'Mounting plate',
  hole: 'Plate screw hole',
  'centre-line': 'Centre and reference lines',
  dimension: 'Dimension',
  'scale-bar': 'Scale check',
};
