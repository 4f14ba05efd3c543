import 'server-only';
import type { DB } from '@/db';
import { findPlanRevision } from '@/db/plan-revisions';
import { getProject, type Project } from '@/db/projects';
import { insertProjectCopy } from '@/db/project-copies';
import { ForbiddenError, ValidationError } from '@/lib/domain/errors';
import { copyName, type ProjectDuplicateInput, type QuickCheckSaveInput } from '@/lib/domain/projects/duplicate';
import type { AppUser } from '@/lib/domain/roles';
import { parsePlanOrThrow } from '@/lib/services/evaluation';

function installerCompany(actor: AppUser): string {
  if (actor.role !== 'installer' || !actor.organizationId) throw new ForbiddenError('Only installers create projects, for their own company.');
  return actor.organizationId;
}

const unknownJurisdiction = (slug: string) => new ValidationError([{ path: 'jurisdiction', message: `Jurisdiction: no jurisdiction '${slug}'.` }]);

/** Starts a new project of the same company from a project's plan (its latest revision, or the one named). */
export async function duplicateProject(db: DB, actor: AppUser, projectId: string, input: ProjectDuplicateInput): Promise<Project> {
  const organizationId = installerCompany(actor);
  const source = await getProject(db, actor, projectId);
  const revision = await findPlanRevision(db, actor, source.id, input.revision ?? 'latest');
  if (!revision) {
    throw new ValidationError([{ path: 'revision', message: input.revision ? `Revision: the project has no revision ${input.revision}.` : 'Revision: the project has no saved plan to copy yet.' }]);
  }
  // A revision saved before today's limits cannot be copied as it is: the copy must parse as a new plan.
  const canonical = parsePlanOrThrow(revision.plan);
  const jurisdiction = input.jurisdiction ?? source.jurisdiction.slug;
  const id = await insertProjectCopy(db, {
    organizationId,
    jurisdictionSlug: jurisdiction,
    name: input.name ?? copyName(source.name),
    siteAddress: input.siteAddress ?? source.siteAddress,
    createdBy: actor.id,
    source: { projectId: source.id, revisionNumber: revision.number },
    plan: revision.plan,
    canonical,
    changeSummary: `Copied from “${source.name}”, revision ${revision.number}`,
  });
  if (!id) throw unknownJurisdiction(jurisdiction);
  return getProject(db, actor, id);
}

/** Keeps a quick check: a new project whose first plan revision is the plan that was checked. */
export async function saveQuickCheck(db: DB, actor: AppUser, input: QuickCheckSaveInput): Promise<Project> {
  const organizationId = installerCompany(actor);
  const canonical = parsePlanOrThrow(input.plan);
  const id = await insertProjectCopy(db, {
    organizationId,
    jurisdictionSlug: input.jurisdiction,
    name: input.name,
    siteAddress: input.siteAddress,
    createdBy: actor.id,
    source: null,
    plan: input.plan,
    canonical,
    changeSummary: 'First plan (from a quick check)',
  });
  if (!id) throw unknownJurisdiction(input.jurisdiction);
  return getProject(db, actor, id);
}
