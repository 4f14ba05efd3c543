import convert from 'convert-units';

/** How a plan enters bare numbers: inches / sq in (imperial) or millimetres / cm² (metric). */
export type UnitSystem = 'imperial' | 'metric';

export type LengthUnit = 'in' | 'ft' | 'mm' | 'cm' | 'm';
export type AreaUnit = 'in2' | 'ft2' | 'mm2' | 'cm2' | 'm2';

export interface UnitError {
  path: string;
  message: string;
}

export type UnitResult = { ok: true; value: number } | { ok: false; error: UnitError };

// convert-units 2.3.4 crosses between systems through truncated anchors: 3.28084 ft per m and
// 10.7639 sq ft per m², where NIST SP 811 gives exactly 1/0.3048 and 1/0.09290304. Its results
// are off by about 3e-8 (lengths) and 1e-6 (areas) relative, enough to fail 10668 mm against a
// 35 ft limit. We let it convert, then scale out its anchor error and trim float noise.
const METRIC_LENGTHS: ReadonlySet<LengthUnit> = new Set(['mm', 'cm', 'm']);
const METRIC_AREAS: ReadonlySet<AreaUnit> = new Set(['mm2', 'cm2', 'm2']);
const LENGTH_ANCHOR_FIX = 1 / 0.3048 / 3.28084; // exact ft per m over convert-units' ft per m
const AREA_ANCHOR_FIX = 1 / 0.09290304 / 10.7639;
const SIGNIFICANT_DIGITS = 12;

function roundSignificant(value: number): number {
  if (value === 0 || !Number.isFinite(value)) return value;
  return Number(value.toPrecision(SIGNIFICANT_DIGITS));
}

function anchorFix(fromMetric: boolean, toMetric: boolean, factor: number): number {
  if (fromMetric === toMetric) return 1;
  return fromMetric ? factor : 1 / factor;
}

export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  if (from === to) return value;
  const raw = convert(value).from(from).to(to);
  return roundSignificant(raw * anchorFix(METRIC_LENGTHS.has(from), METRIC_LENGTHS.has(to), LENGTH_ANCHOR_FIX));
}

export function convertArea(value: number, from: AreaUnit, to: AreaUnit): number {
  if (from === to) return value;
  const raw = convert(value).from(from).to(to);
  return roundSignificant(raw * anchorFix(METRIC_AREAS.has(from), METRIC_AREAS.has(to), AREA_ANCHOR_FIX));
}

export const inchesToMm = (inches: number): number => convertLength(inches, 'in', 'mm');
export const mmToInches = (mm: number): number => convertLength(mm, 'mm', 'in');
export const feetToInches = (feet: number): number => convertLength(feet, 'ft', 'in');
export const sqInToCm2 = (sqIn: number): number => convertArea(sqIn, 'in2', 'cm2');
export const cm2ToSqIn = (cm2: number): number => convertArea(cm2, 'cm2', 'in2');

/** A camelCase key in words: `netFreeArea` → "net free area". */
export function keyWords(key: string): string {
  return key.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
}

// Units sit below the plan, so a unit message names its path in plain words; the plan's parser calls
// with no path and puts the registry's label in front (labelForPath in lib/domain/plan).
function pathLabel(path: string): string {
  if (!path) return 'Value';
  const text = path
    .split('.')
    .map((part) => (/^\d+$/.test(part) ? `item ${Number(part) + 1}` : keyWords(part)))
    .join(' ');
  return text.charAt(0).toUpperCase() + text.slice(1);
}

const NUMBER = String.raw`(?:\d+(?:\.\d*)?|\.\d+)`;
// A whole or decimal number optionally followed by a fraction ("6 1/2", "6-1/2"), or a bare fraction.
const MIXED = String.raw`(?:(${NUMBER})(?:[\s-]+(\d+)\/(\d+))?|(\d+)\/(\d+))`;
const FEET_MARK = String.raw`(?:'|ft\.?|feet|foot)`;
const INCH_MARK = String.raw`(?:"|''|in\.?|inch|inches)`;
const IMPERIAL_LENGTH = new RegExp(
  String.raw`^(?:(${NUMBER})\s*${FEET_MARK})?\s*-?\s*(?:${MIXED}\s*(${INCH_MARK})?)?$`,
);
const METRIC_LENGTH = new RegExp(String.raw`^(${NUMBER})\s*(mm|cm|m)$`);
const AREA = new RegExp(
  String.raw`^(${NUMBER})\s*(sq\.?\s*in\.?|square\s+inch(?:es)?|in²|in2|sq\.?\s*ft\.?|square\s+f(?:ee|oo)t|ft²|ft2|sq\.?\s*cm|cm²|cm2|sq\.?\s*mm|mm²|mm2|sq\.?\s*m|m²|m2)?$`,
);

function normalizeText(input: string): string {
  return input
    .trim()
    .toLowerCase()
    .replace(/[″“”]/g, '"')
    .replace(/[′‘’]/g, "'")
    .replace(/\s+/g, ' ');
}

function fail(path: string, message: string): UnitResult {
  return { ok: false, error: { path, message } };
}

function checkNumber(value: number, path: string, kind: 'length' | 'area'): UnitResult {
  if (!Number.isFinite(value)) return fail(path, `${pathLabel(path)}: must be a finite ${kind}.`);
  if (value < 0) return fail(path, `${pathLabel(path)}: a ${kind} cannot be negative.`);
  return { ok: true, value };
}

function mixedToNumber(whole?: string, num?: string, den?: string, bareNum?: string, bareDen?: string): number | null {
  if (bareNum !== undefined && bareDen !== undefined) {
    const d = Number(bareDen);
    return d === 0 ? null : Number(bareNum) / d;
  }
  if (whole === undefined) return 0;
  let value = Number(whole);
  if (num !== undefined && den !== undefined) {
    const d = Number(den);
    if (d === 0) return null;
    value += Number(num) / d;
  }
  return value;
}

const LENGTH_EXAMPLE = `use e.g. 30 in, 2' 6", 762 mm`;
const AREA_EXAMPLE = 'use e.g. 60 sq in, 0.5 sq ft, 387 cm²';

/**
 * The length parser proper; parseLength adds the magnitude cap.
 */
function parseLengthUncapped(input: unknown, units: UnitSystem, path: string): UnitResult {
  if (typeof input === 'number') {
    const checked = checkNumber(input, path, 'length');
    if (!checked.ok) return checked;
    return { ok: true, value: units === 'metric' ? mmToInches(input) : input };
  }
  if (typeof input !== 'string') {
    return fail(path, `${pathLabel(path)}: expected a length; ${LENGTH_EXAMPLE}.`);
  }
  const text = normalizeText(input);
  const notALength = fail(path, `${pathLabel(path)}: '${input}' is not a length; ${LENGTH_EXAMPLE}.`);
  if (text.startsWith('-')) return fail(path, `${pathLabel(path)}: a length cannot be negative ('${input}').`);
  if (text === '') return notALength;

  const metric = METRIC_LENGTH.exec(text);
  if (metric) {
    const value = Number(metric[1]);
    const unit = metric[2] as LengthUnit;
    return { ok: true, value: convertLength(value, unit, 'in') };
  }

  const imperial = IMPERIAL_LENGTH.exec(text);
  if (!imperial) return notALength;
  const [, feetText, whole, num, den, bareNum, bareDen, inchMark] = imperial;
  const hasInchPart = whole !== undefined || bareNum !== undefined;
  if (feetText === undefined && !hasInchPart) return notALength;
  const inchPart = mixedToNumber(whole, num, den, bareNum, bareDen);
  if (inchPart === null) return notALength;

  if (feetText === undefined && inchMark === undefined) {
    // No unit given: the plan's units apply, as for a bare number.
    return { ok: true, value: units === 'metric' ? mmToInches(inchPart) : inchPart };
  }
  const feet = feetText === undefined ? 0 : Number(feetText);
  // "6 ft 14" is a slip of the pen, not 7' 2": say so rather than guess what was meant.
  if (feetText !== undefined && hasInchPart && inchPart >= 12) {
    const total = feetToInches(feet) + inchPart;
    return fail(
      path,
      `${pathLabel(path)}: inches after the feet must be under 12 ('${input}'); if you meant ${formatLength(total, 'imperial')}, enter that or ${formatLength(total, 'imperial', 'inches')}.`,
    );
  }
  const inches = feet === 0 ? inchPart : feetToInches(feet) + inchPart;
  return checkNumber(inches, path, 'length');
}

const AREA_UNITS: Array<[RegExp, AreaUnit]> = [
  [/^(sq\.?\s*in\.?|square\s+inch(es)?|in²|in2)$/, 'in2'],
  [/^(sq\.?\s*ft\.?|square\s+f(ee|oo)t|ft²|ft2)$/, 'ft2'],
  [/^(sq\.?\s*cm|cm²|cm2)$/, 'cm2'],
  [/^(sq\.?\s*mm|mm²|mm2)$/, 'mm2'],
  [/^(sq\.?\s*m|m²|m2)$/, 'm2'],
];

/** The area parser proper; parseArea adds the magnitude cap. */
function parseAreaUncapped(input: unknown, units: UnitSystem, path: string): UnitResult {
  const bareUnit: AreaUnit = units === 'metric' ? 'cm2' : 'in2';
  if (typeof input === 'number') {
    const checked = checkNumber(input, path, 'area');
    if (!checked.ok) return checked;
    return { ok: true, value: convertArea(input, bareUnit, 'in2') };
  }
  if (typeof input !== 'string') {
    return fail(path, `${pathLabel(path)}: expected an area; ${AREA_EXAMPLE}.`);
  }
  const text = normalizeText(input);
  if (text.startsWith('-')) return fail(path, `${pathLabel(path)}: an area cannot be negative ('${input}').`);
  const match = AREA.exec(text);
  if (!match) return fail(path, `${pathLabel(path)}: '${input}' is not an area; ${AREA_EXAMPLE}.`);
  const value = Number(match[1]);
  const unitText = match[2];
  const unit = unitText === undefined ? bareUnit : AREA_UNITS.find(([re]) => re.test(unitText))?.[1];
  if (!unit) return fail(path, `${pathLabel(path)}: '${input}' is not an area; ${AREA_EXAMPLE}.`);
  return checkNumber(convertArea(value, unit, 'in2'), path, 'area');
}

// Nothing in a laundry closet plan is longer than 1,000 ft or larger than 1,000 sq ft; bigger is a typo,
// and refusing it keeps absurd magnitudes (1e308) out of the arithmetic and the display.
export const MAX_LENGTH_IN = 12_000;
export const MAX_AREA_SQ_IN = 144_000;

/**
 * Parses a length into canonical inches. A number, or a string without a unit, is read in the
 * plan's units (inches for imperial, millimetres for metric).
 */
export function parseLength(input: unknown, units: UnitSystem, path: string): UnitResult {
  const r = parseLengthUncapped(input, units, path);
  if (r.ok && r.value > MAX_LENGTH_IN) return fail(path, `${pathLabel(path)}: ${String(input)} is longer than 1,000 ft; check the number and its unit.`);
  return r;
}

/** Parses an area into canonical square inches; bare values are sq in (imperial) or cm² (metric). */
export function parseArea(input: unknown, units: UnitSystem, path: string): UnitResult {
  const r = parseAreaUncapped(input, units, path);
  if (r.ok && r.value > MAX_AREA_SQ_IN) return fail(path, `${pathLabel(path)}: ${String(input)} is larger than 1,000 sq ft; check the number and its unit.`);
  return r;
}

/**
 * `decimal` is for thin material (a duct wall): thousandths of an inch, tenths of a millimetre; `decimal-fine`
 * one digit more, only where the rounding would make two different thicknesses read the same.
 */
export type LengthStyle = 'feet-inches' | 'inches' | 'decimal' | 'decimal-fine';

function trimDecimal(value: number, places: number): string {
  return value.toFixed(places).replace(/\.?0+$/, '');
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

function inchesWithFraction(sixteenths: number, keepZero = false): string {
  const whole = Math.floor(sixteenths / 16);
  const rest = sixteenths % 16;
  if (rest === 0) return `${whole}`;
  const divisor = gcd(rest, 16);
  const fraction = `${rest / divisor}/${16 / divisor}`;
  return whole === 0 && !keepZero ? fraction : `${whole}-${fraction}`;
}

/**
 * Formats canonical inches for display. Imperial: feet-inches to the nearest 1/16 in
 * (`2' 6-1/2"`, `7-1/4"` under a foot), plain inches (`30-1/2"`) or thousandths of an inch for thin
 * material (`0.016"`). Metric: millimetres to 0.1 mm (`762 mm`, `0.4 mm`).
 */
export function formatLength(inches: number, units: UnitSystem, style: LengthStyle = 'feet-inches'): string {
  if (!Number.isFinite(inches)) return String(inches);
  const sign = inches < 0 ? '-' : '';
  const magnitude = Math.abs(inches);
  if (units === 'metric') {
    const mm = inchesToMm(magnitude);
    return `${sign}${trimDecimal(mm, style === 'decimal-fine' ? 2 : 1)} mm`;
  }
  if (style === 'decimal' || style === 'decimal-fine') return `${sign}${trimDecimal(magnitude, style === 'decimal' ? 3 : 4)}"`;
  const sixteenths = Math.round(magnitude * 16);
  if (style === 'inches' || sixteenths < 12 * 16) return `${sign}${inchesWithFraction(sixteenths)}"`;
  const feet = Math.floor(sixteenths / (12 * 16));
  return `${sign}${feet}' ${inchesWithFraction(sixteenths - feet * 12 * 16, true)}"`;
}

/** Formats canonical square inches: `60 sq in` (imperial) or `387 cm²` (metric), to 0.1. */
export function formatArea(sqIn: number, units: UnitSystem): string {
  if (!Number.isFinite(sqIn)) return String(sqIn);
  if (units === 'metric') return `${trimDecimal(sqInToCm2(sqIn), 1)} cm²`;
  return `${trimDecimal(sqIn, 1)} sq in`;
}
