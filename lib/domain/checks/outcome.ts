import type { EvaluationSummary } from '@/lib/domain/engine';

/** A check's one-word result: anything failing fails it; otherwise missing information leaves it incomplete. */
export type CheckOutcome = 'pass' | 'fail' | 'incomplete';

export function outcomeOf(summary: EvaluationSummary): CheckOutcome {
  if (summary.fail > 0) return 'fail';
  if (summary.needsInfo > 0) return 'incomplete';
  return 'pass';
}
