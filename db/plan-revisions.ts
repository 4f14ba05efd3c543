import type { DB } from '@/db/index';
import type { AppUser } from '@/lib/domain/roles';
import { getProject } from '@/db/projects';
import { PLAN_SCHEMA_VERSION, readStoredPlan, upgradePlan } from '@/lib/domain/plan/upgrade';

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
    .select(['r.id', 'r.project_id', 'r.number', 'r.plan', 'r.canonical', 'r.schema_version', 'r.change_summary', 'r.created_by', 'r.created_at', 'u.name as created_by_name']);
}

type Row = Awaited<ReturnType<ReturnType<typeof revisionQuery>['executeTakeFirstOrThrow']>>;

/** A revision in today's plan shape, whatever version it was saved with (the row itself never changes). */
function toRevision(r: Row): PlanRevision {
  const { plan, canonical } = readStoredPlan({ plan: r.plan, canonical: r.canonical }, r.schema_version);
  return {
    id: r.id,
    projectId: r.project_id,
    number: r.number,
    plan,
    canonical,
    changeSummary: r.change_summary,
    createdBy: { id: r.created_by, name: r.created_by_name },
    createdAt: r.created_at,
  };
}

/**
 * Appends a plan revision in today's plan shape; earlier revisions are never touched. `describe` is
 * given the previous revision's plan in today's shape (null for the first) and returns the change
 * summary stored with the new one.
 */
export async function appendPlanRevision(
  db: DB,
  input: { projectId: string; plan: unknown; canonical: unknown; createdBy: string },
  describe: (previousPlan: unknown | null) => string,
): Promise<PlanRevision> {
  const { projectId, plan, canonical, createdBy } = input;
  return db.transaction().execute(async (trx) => {
    // Lock the project row so two saves at once get consecutive numbers instead of a conflict.
    await trx.selectFrom('projects').select('id').where('id', '=', projectId).forUpdate().executeTakeFirstOrThrow();
    const prev = await trx
      .selectFrom('plan_revisions')
      .select(['number', 'plan', 'schema_version'])
      .where('project_id', '=', projectId)
      .orderBy('number', 'desc')
      .limit(1)
      .executeTakeFirst();
    const summary = describe(prev ? upgradePlan(prev.plan, prev.schema_version) : null);
    const row = await trx
      .insertInto('plan_revisions')
      .values({
        project_id: projectId,
        number: (prev?.number ?? 0) + 1,
        plan: JSON.stringify(plan),
        canonical: JSON.stringify(canonical),
        schema_version: PLAN_SCHEMA_VERSION,
        change_summary: summary,
        created_by: createdBy,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    await trx.updateTable('projects').set({ updated_at: new Date() }).where('id', '=', projectId).execute();
    const saved = await revisionQuery(trx).where('r.id', '=', row.id).executeTakeFirstOrThrow();
    return toRevision(saved);
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

/** Who saved a revision and when, by its id (a report names the revision it was checked from). */
export async function findPlanRevisionSummaryById(db: DB, id: string): Promise<PlanRevisionSummary | null> {
  const row = await revisionQuery(db).where('r.id', '=', id).executeTakeFirst();
  if (!row) return null;
  const { plan: _p, canonical: _c, ...rest } = toRevision(row);
  return rest;
}

export async function findPlanRevision(db: DB, user: AppUser, projectId: string, number: number | 'latest'): Promise<PlanRevision | null> {
  const project = await getProject(db, user, projectId);
  let q = revisionQuery(db).where('r.project_id', '=', project.id);
  q = number === 'latest' ? q.orderBy('r.number', 'desc').limit(1) : q.where('r.number', '=', number);
  const row = await q.executeTakeFirst();
  return row ? toRevision(row) : null;
}

export type ProjectPlanRow = { id: string; name: string; organization: string; revisionNumber: number; plan: unknown };

/** The latest plan revision of every open project in a jurisdiction, in today's plan shape (what a dry run evaluates). */
export async function listLatestPlansInJurisdiction(db: DB, jurisdictionId: string): Promise<ProjectPlanRow[]> {
  const rows = await db
    .selectFrom('projects as p')
    .innerJoin('organizations as o', 'o.id', 'p.organization_id')
    .innerJoinLateral(
      (eb) => eb.selectFrom('plan_revisions as r').select(['r.number', 'r.plan', 'r.schema_version']).whereRef('r.project_id', '=', 'p.id').orderBy('r.number', 'desc').limit(1).as('lr'),
      (join) => join.onTrue(),
    )
    .select(['p.id', 'p.name', 'o.name as organization', 'lr.number', 'lr.plan', 'lr.schema_version'])
    .where('p.jurisdiction_id', '=', jurisdictionId)
    .where('p.archived_at', 'is', null)
    .orderBy('p.name')
    .execute();
  return rows.map((r) => ({ id: r.id, name: r.name, organization: r.organization, revisionNumber: r.number, plan: upgradePlan(r.plan, r.schema_version) }));
}
