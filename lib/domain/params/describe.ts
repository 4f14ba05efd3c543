import { formatArea, formatLength, inchesToMm } from '@/lib/domain/units';
import type { RuleSetParameters } from '@/lib/domain/params/schema';

/**
 * How a parameter's value is read by people: its kind decides the words and units it is shown in.
 * `length` is in inches and shown in feet and inches; `thickness` is sheet-metal gauge (thousandths of
 * an inch); `chart` is the hinge chart; `citations` the list of local amendments.
 */
export type ParameterUnit = 'count' | 'length' | 'thickness' | 'area' | 'cfm' | 'amperes' | 'yes-no' | 'choice' | 'edition' | 'section' | 'chart' | 'citations';

export type ParameterDescription = {
  /** What the trade calls it, as the admin form, diffs and messages show it. */
  label: string;
  unit: ParameterUnit;
  /** For `choice`: each stored value in words. */
  choices?: Record<string, string>;
};

const policyChoices = { never: 'Never', 'over-finished-space': 'Over finished space', always: 'Always' };

const elbow = (kind: string) => ({ label: `Equivalent length of ${kind}`, unit: 'length' as const });

/**
 * Every rule set parameter, by its dotted path: the one place its label and unit are written. The
 * zod schema (lib/domain/params/schema.ts) says what values are valid; this says how to name them.
 */
export const parameterDescriptions = {
  'editions.building': { label: 'Building (residential) code', unit: 'edition' },
  'editions.electrical': { label: 'Electrical code', unit: 'edition' },
  'editions.plumbing': { label: 'Plumbing code', unit: 'edition' },
  'editions.plumbingFamily': { label: 'Plumbing code family', unit: 'choice', choices: { IPC: 'IPC', UPC: 'UPC', IRC: 'IRC (plumbing chapters)' } },
  'editions.mechanical': { label: 'Mechanical code', unit: 'edition' },
  'editions.fuelGas': { label: 'Fuel gas code', unit: 'edition' },
  'exhaust.fittingEquivalentsIn.mitered-45': elbow('a mitered 45° elbow'),
  'exhaust.fittingEquivalentsIn.mitered-90': elbow('a mitered 90° elbow'),
  'exhaust.fittingEquivalentsIn.smooth-6in-45': elbow('a smooth 45° elbow, 6 in radius'),
  'exhaust.fittingEquivalentsIn.smooth-6in-90': elbow('a smooth 90° elbow, 6 in radius'),
  'exhaust.fittingEquivalentsIn.smooth-8in-45': elbow('a smooth 45° elbow, 8 in radius'),
  'exhaust.fittingEquivalentsIn.smooth-8in-90': elbow('a smooth 90° elbow, 8 in radius'),
  'exhaust.fittingEquivalentsIn.smooth-10in-45': elbow('a smooth 45° elbow, 10 in radius'),
  'exhaust.fittingEquivalentsIn.smooth-10in-90': elbow('a smooth 90° elbow, 10 in radius'),
  'exhaust.maxDevelopedLengthIn': { label: 'Maximum developed length', unit: 'length' },
  'exhaust.allowManufacturerLength': { label: "Dryer maker's maximum duct length may replace the code maximum", unit: 'yes-no' },
  'exhaust.lengthLabelTrigger': {
    label: 'Concealed duct length label required',
    unit: 'choice',
    choices: { never: 'Never', concealed: 'Whenever the duct is concealed', 'over-max': 'Only where the length exceeds the code maximum' },
  },
  'exhaust.transitionMaxLengthIn': { label: 'Maximum transition duct length', unit: 'length' },
  'exhaust.nominalDiameterIn': { label: 'Nominal exhaust duct diameter', unit: 'length' },
  'exhaust.minDuctThicknessIn': { label: 'Minimum rigid duct wall thickness', unit: 'thickness' },
  'exhaust.terminationClearanceIn': { label: 'Minimum clearance from the terminal to openings into the building', unit: 'length' },
  'exhaust.fastenerMaxProtrusionIn': { label: 'Greatest fastener protrusion into the duct', unit: 'length' },
  'exhaust.maxSupportSpacingIn': { label: 'Maximum spacing of duct supports', unit: 'length' },
  'exhaust.minTerminalOpeningSqIn': { label: 'Minimum free area of the terminal opening', unit: 'area' },
  'exhaust.shieldPlateMinClearanceIn': { label: 'Clearance from the framing face below which shield plates are needed', unit: 'length' },
  'exhaust.boosterFanPolicy': {
    label: 'Fans allowed in the exhaust',
    unit: 'choice',
    choices: { 'listed-fans': 'Any listed fan', 'power-ventilators-only': 'Only listed dryer exhaust duct power ventilators' },
  },
  'makeupAir.exhaustCfmThreshold': { label: 'Exhaust rate above which make-up air is required', unit: 'cfm' },
  'makeupAir.closetOpeningMinSqIn': { label: 'Minimum opening into a dryer closet', unit: 'area' },
  'gas.shutoffMaxDistanceIn': { label: 'Maximum distance from the gas shut-off valve to the appliance', unit: 'length' },
  'gas.connectorMaxLengthIn': { label: 'Maximum appliance connector length', unit: 'length' },
  'electrical.laundryCircuitMinAmps': { label: 'Minimum laundry branch circuit rating', unit: 'amperes' },
  'electrical.receptacleMaxDistanceIn': { label: 'Maximum distance from a receptacle to its appliance', unit: 'length' },
  'electrical.gfciScope': {
    label: 'Laundry receptacles needing GFCI protection',
    unit: 'choice',
    choices: {
      none: 'None',
      'laundry-125v': 'Laundry receptacles, 125 V',
      'laundry-125-250v': 'Laundry receptacles, 125 V to 250 V',
      'laundry-and-dryer-outlets': 'Laundry receptacles and dryer outlets',
    },
  },
  'electrical.afciLaundry': { label: 'AFCI protection on 120 V 15/20 A laundry circuits', unit: 'yes-no' },
  'electrical.require4WireDryer': { label: 'New dryer circuits must be 4-wire', unit: 'yes-no' },
  'electrical.dryerCircuitMinAmps': { label: 'Minimum electric dryer circuit rating', unit: 'amperes' },
  'plumbing.standpipeMinIn': { label: 'Minimum standpipe height above the trap weir', unit: 'length' },
  'plumbing.standpipeMaxIn': { label: 'Maximum standpipe height above the trap weir', unit: 'length' },
  'plumbing.washerTrapMinIn': { label: 'Minimum washer trap size', unit: 'length' },
  'plumbing.drainPanPolicy': { label: 'Drain pan under the washer required', unit: 'choice', choices: policyChoices },
  'plumbing.drainPanSection': { label: 'Local amendment section requiring the drain pan', unit: 'section' },
  'plumbing.leakShutoffPolicy': { label: 'Automatic leak shut-off required', unit: 'choice', choices: policyChoices },
  'plumbing.leakShutoffSection': { label: 'Local amendment section requiring leak shut-off', unit: 'section' },
  'service.removalMarginIn': { label: 'Opening width needed beyond the widest unit to take it out', unit: 'length' },
  'service.rearZoneMinIn': { label: 'Space behind the units for vent elbow, hoses and cord', unit: 'length' },
  'doors.hingeCountChart': { label: 'Hinges by door height', unit: 'chart' },
  'doors.hingeEdgeMinIn': { label: 'Least distance from a door edge to the nearest hinge cup', unit: 'length' },
  'doors.hingeEdgeMaxIn': { label: 'Greatest distance from a door edge to the nearest hinge cup', unit: 'length' },
  'doors.hingeArmDepthIn': { label: 'Depth for hinge arms between the closed doors and the appliance fronts', unit: 'length' },
  amendments: { label: 'Local amendments cited', unit: 'citations' },
} as const satisfies Record<string, ParameterDescription>;

export type ParameterPath = keyof typeof parameterDescriptions;

/** Group headings of the parameters form and of diffs. */
export const parameterGroupLabels: Record<string, string> = {
  editions: 'Adopted code editions',
  exhaust: 'Dryer exhaust',
  'exhaust.fittingEquivalentsIn': 'Elbow equivalent lengths (fitting table of the adopted code)',
  makeupAir: 'Make-up air',
  gas: 'Gas supply',
  electrical: 'Electrical supply',
  plumbing: 'Water supply and drain',
  service: 'Service clearance (common practice)',
  doors: 'Enclosure door hardware (hinge makers and common practice)',
};

/** The hinge chart's columns. */
export const hingeChartColumns: Record<string, ParameterDescription> = {
  maxDoorHeightIn: { label: 'Door height up to', unit: 'length' },
  hinges: { label: 'Hinges', unit: 'count' },
};

export function describeParameter(path: string): ParameterDescription | null {
  return (parameterDescriptions as Record<string, ParameterDescription>)[path] ?? null;
}

/** A parameter's label; an unknown path (a parameter from a newer build) reads as its last word. */
export function parameterLabel(path: string): string {
  return describeParameter(path)?.label ?? path.split('.').pop()!.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
}

/** The unit symbol the admin form prints beside a number input. */
export function parameterInputUnit(path: string): string | null {
  switch (describeParameter(path)?.unit) {
    case 'length':
    case 'thickness':
      return 'in';
    case 'area':
      return 'sq in';
    case 'cfm':
      return 'cfm';
    case 'amperes':
      return 'A';
    default:
      return null;
  }
}

const NOT_SET = 'not set';

function lengthText(inches: number): string {
  // Under a foot the fraction reads better in inches (4", 1-1/4"); the formatter rounds to 1/16 in.
  return formatLength(inches, 'imperial', inches < 12 ? 'inches' : 'feet-inches');
}

function thicknessText(inches: number): string {
  const thousandths = Math.round(inches * 10_000) / 10;
  return `${thousandths} thousandths of an inch (${Math.round(inchesToMm(inches) * 100) / 100} mm)`;
}

function chartText(value: unknown): string {
  if (!Array.isArray(value) || value.length === 0) return NOT_SET;
  return value
    .map((row: { maxDoorHeightIn?: unknown; hinges?: unknown }) =>
      `${row.hinges ?? '?'} hinges up to ${typeof row.maxDoorHeightIn === 'number' ? lengthText(row.maxDoorHeightIn) : NOT_SET}`,
    )
    .join('; ');
}

function citationsText(value: unknown): string {
  if (!Array.isArray(value) || value.length === 0) return 'none';
  return value.map((a: { parameter?: string; citation?: string }) => `${parameterLabel(String(a.parameter ?? ''))}: ${a.citation ?? ''}`).join('; ');
}

/** A parameter's value in the trade's words: 30' 0", 100 sq in, 20 A, yes, "not set". */
export function parameterValueText(path: string, value: unknown): string {
  if (value === null || value === undefined || value === '') return NOT_SET;
  const description = describeParameter(path);
  const unit = description?.unit;
  if (typeof value === 'number' && Number.isFinite(value)) {
    switch (unit) {
      case 'length':
        return lengthText(value);
      case 'thickness':
        return thicknessText(value);
      case 'area':
        return formatArea(value, 'imperial');
      case 'cfm':
        return `${Math.round(value * 10) / 10} cfm`;
      case 'amperes':
        return `${Math.round(value * 10) / 10} A`;
      default:
        return String(Math.round(value * 1000) / 1000);
    }
  }
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') return description?.choices?.[value] ?? value;
  if (unit === 'chart') return chartText(value);
  if (unit === 'citations') return citationsText(value);
  if (Array.isArray(value)) return `${value.length} rows`;
  return JSON.stringify(value);
}

export type ParameterChange = { path: string; label: string; from: string; to: string };

/** One line of a parameters diff: `Maximum developed length 30' 0" → 32' 0"`. */
export function parameterChangeLine(change: ParameterChange): string {
  return `${change.label} ${change.from} → ${change.to}`;
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Decimals a parameter is shown and entered with: a thousandth of an inch (a duct wall's gauge). */
export const PARAMETER_DECIMALS = 4;

/**
 * Whether two parameter values are the same as people read them: objects key by key (the database
 * reorders keys), numbers to half the last shown decimal (1000 mm is 39.3700787402 in stored and
 * 39.3701 in the form; both are the model's value).
 */
export function sameParameterValue(a: unknown, b: unknown): boolean {
  return sameValue(a, b);
}

function sameValue(a: unknown, b: unknown): boolean {
  if (typeof a === 'number' && typeof b === 'number') return Math.abs(a - b) < 0.5 * 10 ** -PARAMETER_DECIMALS;
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((x, i) => sameValue(x, b[i]));
  if (isPlainObject(a) && isPlainObject(b)) {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    return [...keys].every((k) => sameValue(a[k], b[k]));
  }
  return (a ?? null) === (b ?? null);
}

/**
 * The parameters that differ between two rule sets, in the trade's words. Walks the described
 * paths (so lists such as the hinge chart are one change) and then any path only one side has.
 */
export function describeParameterChanges(from: Partial<RuleSetParameters> | unknown, to: Partial<RuleSetParameters> | unknown): ParameterChange[] {
  const read = (root: unknown, path: string): unknown => {
    let current = root;
    for (const key of path.split('.')) current = isPlainObject(current) ? current[key] : undefined;
    return current;
  };
  const changes: ParameterChange[] = [];
  for (const path of Object.keys(parameterDescriptions)) {
    const a = read(from, path);
    const b = read(to, path);
    if (sameValue(a, b)) continue;
    changes.push({ path, label: parameterLabel(path), from: parameterValueText(path, a), to: parameterValueText(path, b) });
  }
  return changes;
}
