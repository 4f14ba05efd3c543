import { z } from 'zod';
import { parseArea, parseLength } from '@/lib/domain/units';
import { applianceKindLabels, applianceKinds, dryerTypes, fuels, type ApplianceKind } from '@/lib/domain/appliances/kinds';

/*
 * A company's appliance model, as its installers keep it in the library. One list of fields describes it:
 * the API's JSON keys, the CSV header and the plan fields a picked model fills all come from `applianceFields`.
 * Sizes are canonical inches and areas square inches; input also takes text with units ("686 mm", "27 in").
 */

export { applianceKindLabels, applianceKinds, dryerTypes, fuels, type ApplianceKind };

/** Most models a company keeps, and most rows one CSV file brings in (common practice, no published source). */
export const MAX_APPLIANCE_MODELS = 2000;
export const MAX_LABEL_LENGTH = 120;
/** Characters in a size written as text ("2 ft 6-1/2 in"). */
const MAX_SIZE_TEXT = 40;

type FieldKind = 'choice' | 'text' | 'length' | 'area' | 'number' | 'integer';

export interface ApplianceField {
  /** The key in the API's JSON. */
  key: string;
  /** The CSV column. */
  column: string;
  kind: FieldKind;
  label: string;
  help: string;
  required?: boolean;
  choices?: readonly string[];
  /** Only dryers (and combinations) have it; a washer's value must be empty. */
  dryerOnly?: boolean;
}

export const applianceFields = [
  { key: 'kind', column: 'kind', kind: 'choice', label: 'Kind', help: 'washer, dryer or washer-dryer (a combination unit).', required: true, choices: applianceKinds },
  { key: 'label', column: 'label', kind: 'text', label: 'Model label', help: 'The model’s own label as the maker prints it, up to 120 characters.', required: true },
  { key: 'widthIn', column: 'width_in', kind: 'length', label: 'Width', help: 'Cabinet width, inches.', required: true },
  { key: 'depthIn', column: 'depth_in', kind: 'length', label: 'Depth', help: 'Cabinet depth without knobs or the door, inches.', required: true },
  { key: 'heightIn', column: 'height_in', kind: 'length', label: 'Height', help: 'Height as installed, inches.', required: true },
  { key: 'frontProjectionIn', column: 'front_projection_in', kind: 'length', label: 'Front projection', help: 'Knobs, door and handle in front of the cabinet, inches.' },
  { key: 'clearanceSideIn', column: 'clearance_side_in', kind: 'length', label: 'Closet clearance, side', help: 'The maker’s closet clearance at each side, inches.' },
  { key: 'clearanceTopIn', column: 'clearance_top_in', kind: 'length', label: 'Closet clearance, top', help: 'The maker’s closet clearance above, inches.' },
  { key: 'clearanceRearIn', column: 'clearance_rear_in', kind: 'length', label: 'Closet clearance, rear', help: 'The maker’s closet clearance behind (vent, hoses, cord), inches.' },
  { key: 'clearanceFrontIn', column: 'clearance_front_in', kind: 'length', label: 'Closet clearance, front', help: 'The maker’s closet clearance to the closed doors, inches.' },
  { key: 'closetVentTopSqIn', column: 'closet_vent_top_sq_in', kind: 'area', label: 'Closet vent, top', help: 'Net free area the maker asks for at the top of the closet door, sq in.', dryerOnly: true },
  { key: 'closetVentBottomSqIn', column: 'closet_vent_bottom_sq_in', kind: 'area', label: 'Closet vent, bottom', help: 'Net free area the maker asks for at the bottom of the closet door, sq in.', dryerOnly: true },
  { key: 'maxExhaustLengthIn', column: 'max_exhaust_length_in', kind: 'length', label: 'Maximum exhaust length', help: 'The maker’s maximum exhaust duct length, inches (empty when none is given).', dryerOnly: true },
  { key: 'fuel', column: 'fuel', kind: 'choice', label: 'Fuel', help: 'electric or gas.', choices: fuels, dryerOnly: true },
  { key: 'dryerType', column: 'dryer_type', kind: 'choice', label: 'Dryer type', help: 'vented, condensing or heat-pump.', choices: dryerTypes, dryerOnly: true },
  { key: 'exhaustCfm', column: 'exhaust_cfm', kind: 'number', label: 'Exhaust flow', help: 'Exhaust flow, cubic feet per minute.', dryerOnly: true },
  { key: 'volts', column: 'volts', kind: 'integer', label: 'Rated voltage', help: 'Nameplate voltage, V.' },
  { key: 'amps', column: 'amps', kind: 'integer', label: 'Rated current', help: 'Nameplate current or circuit rating, A.' },
] as const satisfies readonly ApplianceField[];

/** The CSV header, in order: the documented import and export format. */
export const APPLIANCE_CSV_HEADER: readonly string[] = applianceFields.map((f) => f.column);

export interface ApplianceModelValues {
  kind: ApplianceKind;
  label: string;
  widthIn: number;
  depthIn: number;
  heightIn: number;
  frontProjectionIn: number | null;
  clearanceSideIn: number | null;
  clearanceTopIn: number | null;
  clearanceRearIn: number | null;
  clearanceFrontIn: number | null;
  closetVentTopSqIn: number | null;
  closetVentBottomSqIn: number | null;
  maxExhaustLengthIn: number | null;
  fuel: (typeof fuels)[number] | null;
  dryerType: (typeof dryerTypes)[number] | null;
  exhaustCfm: number | null;
  volts: number | null;
  amps: number | null;
}

export interface ApplianceModel extends ApplianceModelValues {
  id: string;
  isDemo: boolean;
  createdAt: Date;
  updatedAt: Date;
}

// Sizes a laundry appliance can have: under 100 in in any direction (common practice, no published source).
const MAX_SIZE_IN = 100;

function sizeSchema(field: ApplianceField, kind: 'length' | 'area') {
  const parse = kind === 'length' ? parseLength : parseArea;
  return z
    .union([z.number(), z.string().trim().max(MAX_SIZE_TEXT, `${field.label}: at most ${MAX_SIZE_TEXT} characters.`)], {
      error: `${field.label}: give a ${kind === 'length' ? 'size, e.g. 27 or 686 mm' : 'area, e.g. 48 or 310 cm²'}.`,
    })
    .transform((value, ctx) => {
      const parsed = parse(value, 'imperial', field.key);
      if (!parsed.ok) {
        ctx.addIssue({ code: 'custom', message: `${field.label}: ${parsed.error.message.replace(/^[^:]*: /, '')}` });
        return z.NEVER;
      }
      const v = parsed.value;
      const positive = field.required || field.key === 'maxExhaustLengthIn';
      if (positive ? v <= 0 : v < 0) {
        ctx.addIssue({ code: 'custom', message: `${field.label}: must be ${positive ? 'more than' : 'at least'} 0.` });
        return z.NEVER;
      }
      if (kind === 'length' && field.key !== 'maxExhaustLengthIn' && v >= MAX_SIZE_IN) {
        ctx.addIssue({ code: 'custom', message: `${field.label}: ${value} is ${MAX_SIZE_IN} in or more; check the number and its unit.` });
        return z.NEVER;
      }
      return v;
    });
}

function fieldSchema(field: ApplianceField): z.ZodType {
  switch (field.kind) {
    case 'choice':
      return z.enum(field.choices as unknown as [string, ...string[]], { error: `${field.label}: one of ${field.choices!.join(', ')}.` });
    case 'text':
      return z
        .string({ error: `${field.label}: give the model's label.` })
        .trim()
        .min(1, `${field.label}: give the model's label.`)
        .max(MAX_LABEL_LENGTH, `${field.label}: at most ${MAX_LABEL_LENGTH} characters.`)
        .regex(/^[^\p{Cc}]*$/u, `${field.label}: one line, without control characters.`);
    case 'length':
    case 'area':
      return sizeSchema(field, field.kind);
    case 'number':
      return z.number({ error: `${field.label}: a number.` }).nonnegative(`${field.label}: at least 0.`).max(10_000, `${field.label}: at most 10,000.`);
    case 'integer':
      return z.number({ error: `${field.label}: a whole number.` }).int(`${field.label}: a whole number.`).positive(`${field.label}: more than 0.`).max(1000, `${field.label}: at most 1,000.`);
  }
}

const shape = Object.fromEntries(
  applianceFields.map((f: ApplianceField) => [f.key, f.required ? fieldSchema(f) : fieldSchema(f).nullish()]),
) as Record<string, z.ZodType>;

function dryerOnlyCheck(value: Partial<Record<string, unknown>>, ctx: z.RefinementCtx) {
  if (value.kind !== 'washer') return;
  for (const f of applianceFields as readonly ApplianceField[]) {
    if (f.dryerOnly && value[f.key] != null) {
      ctx.addIssue({ code: 'custom', path: [f.key], message: `${f.label}: a washer has none; leave it empty or choose kind dryer or washer-dryer.` });
    }
  }
}

function withNulls(value: Record<string, unknown>): ApplianceModelValues {
  const out: Record<string, unknown> = {};
  for (const f of applianceFields) out[f.key] = value[f.key] ?? null;
  return out as unknown as ApplianceModelValues;
}

/** A new model (POST and each CSV row): kind, label, width, depth and height required, the rest optional. */
export const applianceInputSchema = z.strictObject(shape).superRefine(dryerOnlyCheck).transform(withNulls);
export type ApplianceInput = z.input<typeof applianceInputSchema>;

/** A change to a model (PATCH): any of the fields; null clears an optional one. */
export const applianceUpdateSchema = z.strictObject(
  Object.fromEntries(applianceFields.map((f: ApplianceField) => [f.key, f.required ? fieldSchema(f).optional() : fieldSchema(f).nullish()])),
);
export type ApplianceUpdate = Partial<ApplianceModelValues>;

/** Checks a model after a change is applied to it (a washer cannot gain a dryer's figures). */
export function checkMerged(values: ApplianceModelValues): { path: string; message: string }[] {
  const errors: { path: string; message: string }[] = [];
  dryerOnlyCheck(values as unknown as Record<string, unknown>, {
    addIssue: (issue: { path?: PropertyKey[]; message?: string }) => errors.push({ path: String(issue.path?.[0] ?? ''), message: issue.message ?? '' }),
  } as unknown as z.RefinementCtx);
  return errors;
}

export const applianceListQuerySchema = z.object({
  kind: z.enum(applianceKinds).optional(),
  q: z.string().trim().max(120).optional(),
});
export type ApplianceListQuery = z.infer<typeof applianceListQuerySchema>;

/** The kinds of model that can stand in a plan's washer or dryer slot: a combination fits either. */
export function kindsFor(slot: 'washer' | 'dryer'): ApplianceKind[] {
  return slot === 'washer' ? ['washer', 'washer-dryer'] : ['dryer', 'washer-dryer'];
}
