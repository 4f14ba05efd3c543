import { z } from 'zod';

/** One field of a form generated from a zod object schema. */
export type FormField =
  | { kind: 'group'; path: string; label: string; children: FormField[] }
  | { kind: 'number'; path: string; label: string; unit: string | null; nullable: boolean; integer: boolean; min: number | null }
  | { kind: 'boolean'; path: string; label: string }
  | { kind: 'enum'; path: string; label: string; options: string[]; nullable: boolean }
  | { kind: 'text'; path: string; label: string; nullable: boolean }
  | { kind: 'rows'; path: string; label: string; row: FormField[] };

// Units are spelled out at the end of each parameter's description, e.g. "(inches)".
const UNIT_SUFFIXES: [RegExp, string][] = [
  [/\s*\((inches)\)\.?$/i, 'in'],
  [/\s*\((square inches)\)\.?$/i, 'sq in'],
  [/\s*\((cfm)\)\.?$/i, 'cfm'],
  [/\s*\((amperes)\)\.?$/i, 'A'],
];

function splitUnit(description: string): { label: string; unit: string | null } {
  for (const [re, unit] of UNIT_SUFFIXES) {
    if (re.test(description)) return { label: description.replace(re, ''), unit };
  }
  return { label: description, unit: null };
}

function humanize(key: string): string {
  const words = key.replace(/([a-z])([A-Z])/g, '$1 $2').replace(/-/g, ' ').toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

type Unwrapped = { schema: z.ZodType; nullable: boolean; description: string | undefined };

function unwrap(schema: z.ZodType): Unwrapped {
  let current = schema;
  let nullable = false;
  let description = schema.description;
  while (current instanceof z.ZodNullable || current instanceof z.ZodOptional) {
    if (current instanceof z.ZodNullable) nullable = true;
    current = current.unwrap() as z.ZodType;
    description ??= current.description;
  }
  return { schema: current, nullable, description: description ?? current.description };
}

function numberBounds(schema: z.ZodNumber): { integer: boolean; min: number | null } {
  const min = schema.minValue;
  return { integer: schema.isInt, min: typeof min === 'number' && Number.isFinite(min) ? min : null };
}

function fieldFor(key: string, schema: z.ZodType, path: string): FormField {
  const { schema: inner, nullable, description } = unwrap(schema);
  const { label, unit } = splitUnit(description ?? humanize(key));
  if (inner instanceof z.ZodObject) {
    return { kind: 'group', path, label, children: fieldsOf(inner, path) };
  }
  if (inner instanceof z.ZodArray) {
    const element = unwrap(inner.element as z.ZodType).schema;
    if (!(element instanceof z.ZodObject)) throw new Error(`form-schema: arrays of ${element.constructor.name} are not supported (${path})`);
    return { kind: 'rows', path, label, row: fieldsOf(element, '') };
  }
  if (inner instanceof z.ZodNumber) return { kind: 'number', path, label, unit, nullable, ...numberBounds(inner) };
  if (inner instanceof z.ZodBoolean) return { kind: 'boolean', path, label };
  if (inner instanceof z.ZodEnum) return { kind: 'enum', path, label, options: inner.options.map(String), nullable };
  if (inner instanceof z.ZodString) return { kind: 'text', path, label, nullable };
  throw new Error(`form-schema: unsupported field type ${inner.constructor.name} at ${path}`);
}

/**
 * The fields of a zod object schema, in declaration order, labelled from their `.describe()`
 * text. The rule set parameters form is generated from this, so a new parameter appears in the
 * admin screens as soon as the schema has it.
 */
export function fieldsOf(schema: z.ZodObject, base = ''): FormField[] {
  return Object.entries(schema.shape as Record<string, z.ZodType>).map(([key, child]) => fieldFor(key, child, base ? `${base}.${key}` : key));
}

export function readPath(value: unknown, path: string): unknown {
  let current: unknown = value;
  for (const key of path.split('.')) {
    if (current === null || typeof current !== 'object') return undefined;
    current = (current as Record<string, unknown>)[key];
  }
  return current;
}

/** Leaf fields flattened with their full paths (rows stay one entry). */
export function leafFields(fields: FormField[]): FormField[] {
  return fields.flatMap((f) => (f.kind === 'group' ? leafFields(f.children) : [f]));
}
