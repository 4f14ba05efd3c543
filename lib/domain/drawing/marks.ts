import type { Finding } from '@/lib/domain/engine';
import type { MarkStatus } from '@/lib/domain/drawing/shapes';

export interface Mark {
  status: MarkStatus;
  title?: string;
  message?: string;
}

export type MarkSource = string | (Pick<Finding, 'ruleKey' | 'status'> & Partial<Pick<Finding, 'title' | 'message'>>);

/**
 * Which rules to mark on a drawing. A bare rule key marks it as failing; findings are marked
 * when they did not pass (`fail`, or `caution` from a caution-severity rule). Passing,
 * needs-info and not-applicable findings leave the drawing unmarked.
 */
export function toMarks(sources: readonly MarkSource[] = []): Map<string, Mark> {
  const marks = new Map<string, Mark>();
  for (const source of sources) {
    if (typeof source === 'string') {
      marks.set(source, { status: 'fail' });
    } else if (source.status === 'fail' || source.status === 'caution') {
      marks.set(source.ruleKey, { status: source.status, title: source.title, message: source.message });
    }
  }
  return marks;
}

/** Notes for the marked rules a drawing shows, in the engine's own words where given. */
export function markNotes(marks: ReadonlyMap<string, Mark>, ruleKeys: readonly string[]): string[] {
  return ruleKeys.flatMap((key) => {
    const mark = marks.get(key);
    if (!mark) return [];
    const label = mark.status === 'fail' ? 'Fails' : 'Caution';
    const text = [mark.title, mark.message].filter(Boolean).join(': ');
    return [`${label} — ${text || key}`];
  });
}
