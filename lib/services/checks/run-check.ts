import 'server-only';
import type { DB } from '@/db';
import { insertCheck, type StoredCheck } from '@/db/checks';
import { findPlanRevision } from '@/db/plan-revisions';
import { getProject } from '@/db/projects';
import type { AppUser } from '@/lib/domain/roles';
import { ConflictError, NotFoundError } from '@/lib/domain/errors';
import { evaluateUnder, parsePlanOrThrow, publishedRuleSetOf } from '@/lib/services/evaluation';
import { withoutAdminNotes } from '@/lib/domain/engine';

/** Runs a check of a plan revision (the latest by default) against the jurisdiction's published rule set, and stores it. */
export async function runCheck(db: DB, user: AppUser, projectId: string, revisionNumber?: number): Promise<StoredCheck> {
  const project = await getProject(db, user, projectId);
  const revision = await findPlanRevision(db, user, project.id, revisionNumber ?? 'latest');
  if (!revision) {
    throw revisionNumber ? new NotFoundError(`This project has no plan revision ${revisionNumber}.`) : new ConflictError('Save a plan before running a check.');
  }
  const ruleSet = await publishedRuleSetOf(db, project.jurisdiction.id);
  if (!ruleSet) throw new ConflictError(`${project.jurisdiction.name} has no published rule set yet; ask an administrator to publish one.`);
  // Parse again from what the installer entered (upgraded to today's shape by the repository), so the
  // check uses today's unit parsing and never a stale form.
  const plan = parsePlanOrThrow(revision.plan);
  const started = performance.now();
  // A check is the installer's record: the rule-set admins' notes are not part of it.
  const evaluation = withoutAdminNotes(await evaluateUnder(ruleSet, plan));
  const durationMs = performance.now() - started;
  return insertCheck(db, {
    user,
    projectId: project.id,
    planRevisionId: revision.id,
    ruleSetId: ruleSet.id,
    inputs: { plan: revision.plan, canonical: plan },
    evaluation,
    durationMs,
  });
}
