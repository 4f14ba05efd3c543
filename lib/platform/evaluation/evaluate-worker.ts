// Entry of an evaluation thread: the pool in evaluation-pool.ts sends it a plan and a published rule set's id,
// and gets the API's answer back as UTF-8 bytes, ready to send. Built to <build>/evaluation-worker/evaluate-worker.mjs by
// scripts/build-report-worker.mjs.
import { evaluationAnswer, type FindingsWanted } from '@/lib/domain/api/evaluation-answer';
import type { FieldError } from '@/lib/domain/errors';
import type { RuleSetForEvaluation } from '@/lib/domain/engine';

export type EvaluationTask = {
  /** A published or retired version: immutable, so a thread keeps it by id once it has been sent. */
  ruleSetId: string;
  /** Sent only when the thread asked for it (it did not hold that version yet). */
  ruleSet?: RuleSetForEvaluation;
  plan: unknown;
  findings: FindingsWanted;
};

/**
 * The answer as the bytes the response sends: encoded here, so the request thread neither checks nor encodes a
 * whole answer's text (≈ 40 KB with every finding) before writing it.
 */
export type EncodedAnswer = { ok: true; body: Uint8Array<ArrayBuffer> } | { ok: false; errors: FieldError[] };

export type EvaluationReply = EncodedAnswer | { needsRuleSet: true };

const utf8 = new TextEncoder();

/** The API's answer for a plan, encoded (the pool's in-thread fallback uses it too). */
export async function encodedAnswer(ruleSet: RuleSetForEvaluation, plan: unknown, findings: FindingsWanted): Promise<EncodedAnswer> {
  const answer = await evaluationAnswer(ruleSet, plan, findings);
  return answer.ok ? { ok: true, body: utf8.encode(answer.body) } : answer;
}

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
  return encodedAnswer(ruleSet, task.plan, task.findings);
}
