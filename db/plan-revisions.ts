import type { DB } from '@/db/index';
import type { AppUser } from '@/lib/domain/roles';
import { getProject } from '@/db/projects';
import { diffPlans, summarizeChanges, type PlanChange } from '@/lib/domain/revisions/change-summary';

export type PlanRevision = {
  id: string;
  projectId: string;
  number: number;
  plan: unknown;
  canonical: unknown;
  changeSummary: string;
  createdBy: { id: string | null; name: string | null };
  createdAt: Date;
};

export type PlanRevisionSummary = Omit<PlanRevision, 'plan' | 'canonical'>;

function revisionQuery(db: DB) {
  return db
    .selectFrom('plan_revisions as r')
    .leftJoin('users as u', 'u.id', 'r.created_by')
    .select(['r.id', 'r.project_id', 'r.number', 'r.plan', 'r.canonical', 'r.change_summary', 'r.created_by', 'r.created_at', 'u.name as created_by_name']);
}

type Row = Awaited<ReturnType<ReturnType<typeof revisionQuery>['executeTakeFirstOrThrow']>>;

function toRevision(r: Row): PlanRevision {
  return {
    id: r.id,
    projectId: r.project_id,
    number: r.number,
    plan: r.plan,
    canonical: r.canonical,
    changeSummary: r.change_summary,
    createdBy: { id: r.created_by, name: r.created_by_name },
    createdAt: r.created_at,
  };
}

/** Saves a new plan revision; earlier revisions are never touched. */
export async function createPlanRevision(
  db: DB,
  user: AppUser,
  projectId: string,
  plan: unknown,
  canonical: unknown,
): Promise<{ revision: PlanRevision; changes: PlanChange[] }> {
  const project = await getProject(db, user, projectId);
  return db.transaction().execute(async (trx) => {
    // Lock the project row so two saves at once get consecutive numbers instead of a conflict.
    await trx.selectFrom('projects').select('id').where('id', '=', project.id).forUpdate().executeTakeFirstOrThrow();
    const prev = await trx
      .selectFrom('plan_revisions')
      .select(['number', 'plan'])
      .where('project_id', '=', project.id)
      .orderBy('number', 'desc')
      .limit(1)
      .executeTakeFirst();
    const changes = prev ? diffPlans(prev.plan, plan) : [];
    const summary = prev ? summarizeChanges(changes) : 'First plan';
    const row = await trx
      .insertInto('plan_revisions')
      .values({
        project_id: project.id,
        number: (prev?.number ?? 0) + 1,
        plan: JSON.stringify(plan),
        canonical: JSON.stringify(canonical),
        change_summary: summary,
        created_by: user.id,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    await trx.updateTable('projects').set({ updated_at: new Date() }).where('id', '=', project.id).execute();
    const saved = await revisionQuery(trx).where('r.id', '=', row.id).executeTakeFirstOrThrow();
    return { revision: toRevision(saved), changes };
  });
}

export async function listPlanRevisions(db: DB, user: AppUser, projectId: string): Promise<PlanRevisionSummary[]> {
  const project = await getProject(db, user, projectId);
  const rows = await revisionQuery(db).where('r.project_id', '=', project.id).orderBy('r.number', 'desc').execute();
  return rows.map((r) => {
    const { plan: _p, canonical: _c, ...rest } = toRevision(r);
    return rest;
  });
}

export async function getPlanRevision(db: DB, user: AppUser, projectId: string, number: number | 'latest'): Promise<PlanRevision | null> {
  const project = await getProject(db, user, projectId);
  let q = revisionQuery(db).where('r.project_id', '=', project.id);
  q = number === 'latest' ? q.orderBy('r.number', 'desc').limit(1) : q.where('r.number', '=', number);
  const row = await q.executeTakeFirst();
  return row ? toRevision(row) : null;
}
