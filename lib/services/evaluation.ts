import 'server-only';
import type { DB } from '@/db';
import type { RuleSetWithRules } from '@/db/rule-sets';
import type { FindingsWanted } from '@/lib/domain/api/evaluation-answer';
import { evaluate, type Evaluation } from '@/lib/domain/engine';
import { NotFoundError, ValidationError } from '@/lib/domain/errors';
import { parsePlan, type Plan } from '@/lib/domain/plan';
import { answerOffThread } from '@/lib/platform/evaluation/evaluation-pool';
import { jurisdictionWithPublished, loadImmutableRuleSet, loadPublishedRuleSet } from '@/lib/services/checks/rule-set-cache';

/*
 * The one road from a plan to findings: parse the plan as entered, load a rule set version,
 * evaluate. The evaluation API, checks, dry runs and the impact page all travel it.
 */

export type EvaluatedPlan = { plan: Plan; evaluation: Evaluation };

/** The plan as entered, in canonical units; a refusal names every field under `plan.`. */
export function parsePlanOrThrow(raw: unknown): Plan {
  const parsed = parsePlan(raw);
  if (!parsed.ok) throw new ValidationError(parsed.errors.map((e) => ({ path: `plan.${e.path}`, message: e.message })));
  return parsed.plan;
}

/** Evaluates a parsed plan under one rule set version (a draft too: only immutable versions are cached by id). */
export function evaluateUnder(ruleSet: RuleSetWithRules, plan: Plan): Promise<Evaluation> {
  return evaluate(
    { id: ruleSet.status === 'draft' ? undefined : ruleSet.id, jurisdiction: ruleSet.jurisdictionSlug, version: ruleSet.version, parameters: ruleSet.parameters, rules: ruleSet.rules },
    plan,
  );
}

/** The jurisdiction's published rule set; null before its first publication. */
export function publishedRuleSetOf(db: DB, jurisdictionId: string): Promise<RuleSetWithRules | null> {
  return loadPublishedRuleSet(db, jurisdictionId);
}

/**
 * The evaluation API's answer, as UTF-8 JSON: the jurisdiction's published version (from memory after the first
 * request) → parse and evaluate the plan on an evaluation thread → the answer. Nothing is stored.
 */
export async function evaluationAnswerForJurisdiction(db: DB, input: { jurisdiction: string; plan: unknown; findings: FindingsWanted }): Promise<Uint8Array<ArrayBuffer>> {
  const jurisdiction = await jurisdictionWithPublished(db, input.jurisdiction);
  if (!jurisdiction) throw new NotFoundError(`No jurisdiction '${input.jurisdiction}'. GET /api/jurisdictions lists them.`);
  const ruleSet = jurisdiction.publishedRuleSetId ? await loadImmutableRuleSet(db, jurisdiction.publishedRuleSetId) : null;
  if (!ruleSet) throw new NotFoundError(`${jurisdiction.name} has no published rule set yet.`);
  const answer = await answerOffThread(
    { id: ruleSet.id, jurisdiction: ruleSet.jurisdictionSlug, version: ruleSet.version, parameters: ruleSet.parameters, rules: ruleSet.rules },
    input.plan,
    input.findings,
  );
  if (!answer.ok) throw new ValidationError(answer.errors);
  return answer.body;
}

/**
 * Evaluates a stored plan under one or two versions for a comparison (dry run, impact): a plan that no
 * longer parses, or a draft rule that trips the engine, becomes a message on that subject, never a failed run.
 */
export async function evaluateForComparison(
  raw: unknown,
  versions: { before: RuleSetWithRules | null; after: RuleSetWithRules },
): Promise<{ parseError: string | null; before: Evaluation | null; after: Evaluation | null; error: string | null }> {
  const parsed = parsePlan(raw);
  if (!parsed.ok) {
    return { parseError: parsed.errors.slice(0, 3).map((e) => `${e.path}: ${e.message}`).join('; '), before: null, after: null, error: null };
  }
  const safely = async (set: RuleSetWithRules) => {
    try {
      return { evaluation: await evaluateUnder(set, parsed.plan), error: null };
    } catch (err) {
      return { evaluation: null, error: `version ${set.version} could not evaluate this plan: ${(err as Error).message}` };
    }
  };
  const a = versions.before ? await safely(versions.before) : { evaluation: null, error: null };
  const b = await safely(versions.after);
  return { parseError: null, before: a.evaluation, after: b.evaluation, error: a.error ?? b.error };
}
