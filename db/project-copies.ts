import type { DB } from '@/db/index';
import { writeAudit } from '@/db/audit';
import { PLAN_SCHEMA_VERSION } from '@/lib/domain/plan/upgrade';

/**
 * A new project of the same company with one plan revision copied from another project: both rows in one
 * transaction, so a copy never exists without its plan. The source project and its history stay untouched.
 */
export async function insertProjectCopy(
  db: DB,
  input: {
    organizationId: string;
    jurisdictionSlug: string;
    name: string;
    siteAddress: string;
    createdBy: string;
    source: { projectId: string; revisionNumber: number } | null;
    plan: unknown;
    canonical: unknown;
    changeSummary: string;
  },
): Promise<string | null> {
  return db.transaction().execute(async (trx) => {
    const jurisdiction = await trx.selectFrom('jurisdictions').select('id').where('slug', '=', input.jurisdictionSlug).executeTakeFirst();
    if (!jurisdiction) return null;
    const project = await trx
      .insertInto('projects')
      .values({ organization_id: input.organizationId, jurisdiction_id: jurisdiction.id, name: input.name, site_address: input.siteAddress, created_by: input.createdBy })
      .returning('id')
      .executeTakeFirstOrThrow();
    await trx
      .insertInto('plan_revisions')
      .values({
        project_id: project.id,
        number: 1,
        plan: JSON.stringify(input.plan),
        canonical: JSON.stringify(input.canonical),
        schema_version: PLAN_SCHEMA_VERSION,
        change_summary: input.changeSummary,
        created_by: input.createdBy,
      })
      .execute();
    await writeAudit(trx, {
      actorUserId: input.createdBy,
      action: input.source ? 'project.duplicate' : 'project.create',
      entityType: 'project',
      entityId: project.id,
      details: input.source ? { from: input.source.projectId, revision: input.source.revisionNumber, name: input.name } : { name: input.name, from: 'quick check' },
    });
    return project.id;
  });
}
