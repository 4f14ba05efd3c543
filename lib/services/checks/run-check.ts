import 'server-only';
import type { DB } from '@/db';
import { insertCheck, type StoredCheck } from '@/db/checks';
import { getPlanRevision } from '@/db/plan-revisions';
import { getProject } from '@/db/projects';
import type { AppUser } from '@/lib/domain/roles';
import { evaluate } from '@/lib/domain/engine';
import { ConflictError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import { parsePlan } from '@/lib/domain/plan';
import { loadPublishedRuleSet } from '@/lib/services/checks/rule-set-cache';

/** Runs a check of a plan revision (the latest by default) against the jurisdiction's published rule set, and stores it. */
export async function runCheck(db: DB, user: AppUser, projectId: string, revisionNumber?: number): Promise<StoredCheck> {
  const project = await getProject(db, user, projectId);
  const revision = await getPlanRevision(db, user, project.id, revisionNumber ?? 'latest');
  if (!revision) {
    throw revisionNumber ? new NotFoundError(`This project has no plan revision ${revisionNumber}.`) : new ConflictError('Save a plan before running a check.');
  }
  const ruleSet = await loadPublishedRuleSet(db, project.jurisdiction.id);
  if (!ruleSet) throw new ConflictError(`${project.jurisdiction.name} has no published rule set yet; ask an administrator to publish one.`);
  // Parse again from what the installer entered, so the check uses today's unit parsing and never a stale form.
  const parsed = parsePlan(revision.plan);
  if (!parsed.ok) throw new ValidationError(parsed.errors.map((e) => ({ path: `plan.${e.path}`, message: e.message })));
  const started = performance.now();
  const evaluation = await evaluate(
    { id: ruleSet.id, jurisdiction: project.jurisdiction.slug, version: ruleSet.version, parameters: ruleSet.parameters, rules: ruleSet.rules },
    parsed.plan,
  );
  const durationMs = performance.now() - started;
  return insertCheck(db, {
    user,
    projectId: project.id,
    planRevisionId: revision.id,
    ruleSetId: ruleSet.id,
    inputs: { plan: revision.plan, canonical: parsed.plan },
    evaluation,
    durationMs,
  });
}
