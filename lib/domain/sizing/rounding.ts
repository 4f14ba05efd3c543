import { cm2ToSqIn, inchesToMm, mmToInches, sqInToCm2, type UnitSystem } from '@/lib/domain/units';

// Below a millionth of an inch, float noise from unit conversion, not a real shortfall.
const NOISE = 1e-6;

/** The next size up the installer can measure: 1/16 in on an imperial plan, 1 mm on a metric one. */
export function roundUpToMeasure(inches: number, units: UnitSystem): number {
  if (units === 'metric') return mmToInches(Math.ceil(inchesToMm(inches) - NOISE));
  return Math.ceil(inches * 16 - NOISE) / 16;
}

/** The next size down that can be measured (for a value that must not exceed a maximum). */
export function roundDownToMeasure(inches: number, units: UnitSystem): number {
  if (units === 'metric') return mmToInches(Math.floor(inchesToMm(inches) + NOISE));
  return Math.floor(inches * 16 + NOISE) / 16;
}

/** The form's text for a canonical length in the plan's units: inches to 1/16 as a decimal, or whole millimetres. */
export function lengthFormText(inches: number, units: UnitSystem): string {
  if (units === 'metric') return String(Math.round(inchesToMm(inches)));
  return String(Math.round(inches * 16) / 16);
}

/** The next area up the installer can cut or buy: a whole square inch, or a whole square centimetre on a metric plan. */
export function roundUpAreaToMeasure(sqIn: number, units: UnitSystem): number {
  if (units === 'metric') return cm2ToSqIn(Math.ceil(sqInToCm2(sqIn) - NOISE));
  return Math.ceil(sqIn - NOISE);
}

export function roundDownAreaToMeasure(sqIn: number, units: UnitSystem): number {
  if (units === 'metric') return cm2ToSqIn(Math.floor(sqInToCm2(sqIn) + NOISE));
  return Math.floor(sqIn + NOISE);
}

/** The form's text for a canonical area in the plan's units: square inches to 0.01, or whole square centimetres. */
export function areaFormText(sqIn: number, units: UnitSystem): string {
  if (units === 'metric') return String(Math.round(sqInToCm2(sqIn)));
  return String(Math.round(sqIn * 100) / 100);
}
