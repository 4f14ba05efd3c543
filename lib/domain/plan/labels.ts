import { keyWords } from '@/lib/domain/units';
import { entryAt, patternOf, type PlanFieldPattern } from '@/lib/domain/plan/registry';

/**
 * A plan field's label in messages, from the registry: `exhaust.run.2.straight` reads "Exhaust run item 3
 * straight". Each key reads as its entry's `term`, or the key in words; a key the plan does not have (an
 * unknown field named in an error) reads as its words.
 */
export function labelForPath(path: string): string {
  if (!path) return 'Value';
  const parts = path.split('.');
  const text = parts
    .map((part, i) => {
      if (/^\d+$/.test(part)) return `item ${Number(part) + 1}`;
      const term = entryAt(parts.slice(0, i + 1).join('.'))?.entry.term;
      return term ?? keyWords(part);
    })
    .join(' ');
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Whether the field at a path holds an area (sq in / cm²) rather than a length. */
export function isAreaPath(path: string): boolean {
  return entryAt(path)?.entry.kind === 'area';
}

/** Whether a plan path is one of `fields` or lies inside one of them (`doors.0.width` inside `doors`). */
export function isPathWithin(path: string, fields: readonly PlanFieldPattern[]): boolean {
  const pattern = patternOf(path);
  return fields.some((field) => pattern === field || pattern.startsWith(`${field}.`));
}
