import 'server-only';
import type { DB } from '@/db';
import { appendPlanRevision, type PlanRevision } from '@/db/plan-revisions';
import { getProject } from '@/db/projects';
import { diffPlans, summarizeChanges, type PlanChange } from '@/lib/domain/revisions/change-summary';
import type { AppUser } from '@/lib/domain/roles';
import { parsePlanOrThrow } from '@/lib/services/evaluation';

/** Saves the plan as entered as the project's next revision, with what changed since the previous one. */
export async function savePlan(db: DB, actor: AppUser, input: { projectId: string; plan: unknown }): Promise<{ revision: PlanRevision; changes: PlanChange[] }> {
  const canonical = parsePlanOrThrow(input.plan);
  const project = await getProject(db, actor, input.projectId);
  let changes: PlanChange[] = [];
  const revision = await appendPlanRevision(db, { projectId: project.id, plan: input.plan, canonical, createdBy: actor.id }, (previous) => {
    if (previous === null) return 'First plan';
    changes = diffPlans(previous, input.plan);
    return summarizeChanges(changes);
  });
  return { revision, changes };
}
