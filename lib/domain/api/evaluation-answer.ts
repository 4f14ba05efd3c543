import type { FieldError } from '@/lib/domain/errors';
import { evaluate, withoutAdminNotes, type RuleSetForEvaluation } from '@/lib/domain/engine';
import { parsePlan } from '@/lib/domain/plan';

/*
 * The evaluation API's answer, from a published rule set and the plan as sent: parse, evaluate, leave out what
 * is meant for rule-set admins, keep only the failing findings when asked, and serialize. It needs nothing but
 * its arguments, so the API runs it on an evaluation thread (lib/platform/evaluation) and hands back the text.
 */

export type FindingsWanted = 'all' | 'failing';

export type EvaluationAnswer =
  | { ok: true; body: string }
  | { ok: false; errors: FieldError[] };

export async function evaluationAnswer(ruleSet: RuleSetForEvaluation, rawPlan: unknown, wanted: FindingsWanted): Promise<EvaluationAnswer> {
  const parsed = parsePlan(rawPlan);
  // A refusal names every field under `plan.`, as the request body holds it.
  if (!parsed.ok) return { ok: false, errors: parsed.errors.map((e) => ({ path: `plan.${e.path}`, message: e.message })) };
  const evaluation = withoutAdminNotes(await evaluate(ruleSet, parsed.plan));
  // The summary always counts every finding, whichever findings the answer carries.
  const findings = wanted === 'failing' ? evaluation.findings.filter((f) => f.status === 'fail') : evaluation.findings;
  return { ok: true, body: JSON.stringify({ ruleSet: evaluation.ruleSet, summary: evaluation.summary, findings }) };
}
