import type { z } from 'zod';
import type { FieldError } from '@/lib/domain/errors';
import { labelForPath, type UnitSystem } from '@/lib/domain/units';
import { canonicalPlanSchema, planInputSchema, unitSystemSchema, UNIT_ISSUE, type Plan } from '@/lib/domain/plan/schema';

export * from '@/lib/domain/plan/schema';

export type { FieldError };

export type ParsePlanResult = { ok: true; plan: Plan } | { ok: false; errors: FieldError[] };

function joinPath(path: ReadonlyArray<PropertyKey>): string {
  return path.map(String).join('.');
}

function isAreaPath(path: string): boolean {
  return /(netFreeArea|closetVent\.(top|bottom))$/.test(path);
}

function describeIssue(issue: z.core.$ZodIssue): FieldError[] {
  const path = joinPath(issue.path);
  const label = labelForPath(path);
  switch (issue.code) {
    case 'unrecognized_keys':
      return issue.keys.map((key) => {
        const fieldPath = path ? `${path}.${key}` : key;
        return {
          path: fieldPath,
          message: `${path ? label : 'Plan'}: unknown field '${key}'; remove it or check the spelling.`,
        };
      });
    case 'custom':
      // Unit-conversion issues carry a message written without the path; add the field's label.
      if (issue.params?.[UNIT_ISSUE]) return [{ path, message: `${label}${issue.message.replace(/^Value/, '')}` }];
      return [{ path, message: issue.message }];
    case 'invalid_type':
      if (issue.input === undefined) return [{ path, message: `${label}: required.` }];
      return [{ path, message: `${label}: expected ${issue.expected}.` }];
    case 'invalid_value':
      return [
        {
          path,
          message: `${label}: must be one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')}.`,
        },
      ];
    case 'invalid_union': {
      const nested = issue.errors.flat();
      if (nested.length > 0 && nested.every((n) => n.code === 'invalid_value')) {
        const values = nested.flatMap((n) => (n.code === 'invalid_value' ? n.values : []));
        return [{ path, message: `${label}: must be one of ${values.map((v) => JSON.stringify(v)).join(', ')}.` }];
      }
      const example = isAreaPath(path) ? '60 sq in or 387 cm²' : `30 in, 2' 6" or 762 mm`;
      return [{ path, message: `${label}: expected a number in the plan's units, or text with units such as ${example}.` }];
    }
    default:
      return [{ path, message: `${label}: ${issue.message}` }];
  }
}

/**
 * Validates a plan and converts every length to inches and every area to square inches, reading
 * bare numbers in the plan's own units. Errors name the field path (`enclosure.width`).
 */
export function parsePlan(input: unknown): ParsePlanResult {
  const units = unitSystemSchema.safeParse((input as { units?: unknown } | null)?.units);
  const schema = units.success ? canonicalPlanSchema(units.data as UnitSystem) : planInputSchema;
  const result = schema.safeParse(input);
  if (result.success && units.success) return { ok: true, plan: result.data as unknown as Plan };
  const issues = result.success ? [] : result.error.issues;
  const errors = issues.flatMap(describeIssue);
  if (!units.success && !errors.some((e) => e.path === 'units')) {
    errors.unshift({ path: 'units', message: "Units: must be 'imperial' or 'metric'." });
  }
  return { ok: false, errors };
}
