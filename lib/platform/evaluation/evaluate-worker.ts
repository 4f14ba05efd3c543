// Entry of an evaluation thread: the pool in evaluation-pool.ts sends it a plan and a published rule set's id,
// and gets the API's answer back as text. Built to <build>/evaluation-worker/evaluate-worker.mjs by
// scripts/build-report-worker.mjs.
import { evaluationAnswer, type EvaluationAnswer, type FindingsWanted } from '@/lib/domain/api/evaluation-answer';
import type { RuleSetForEvaluation } from '@/lib/domain/engine';

export type EvaluationTask = {
  /** A published or retired version: immutable, so a thread keeps it by id once it has been sent. */
  ruleSetId: string;
  /** Sent only when the thread asked for it (it did not hold that version yet). */
  ruleSet?: RuleSetForEvaluation;
  plan: unknown;
  findings: FindingsWanted;
};

export type EvaluationReply = EvaluationAnswer | { needsRuleSet: true };

const KEPT = 50;
const ruleSets = new Map<string, RuleSetForEvaluation>();

export default async function evaluateInWorker(task: EvaluationTask): Promise<EvaluationReply> {
  let ruleSet = ruleSets.get(task.ruleSetId);
  if (!ruleSet && task.ruleSet) {
    ruleSet = { ...task.ruleSet, id: task.ruleSetId };
    if (ruleSets.size >= KEPT) ruleSets.delete(ruleSets.keys().next().value!);
    ruleSets.set(task.ruleSetId, ruleSet);
  }
  if (!ruleSet) return { needsRuleSet: true };
  return evaluationAnswer(ruleSet, task.plan, task.findings);
}
