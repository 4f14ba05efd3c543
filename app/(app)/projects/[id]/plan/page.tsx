import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db';
import { findJurisdictionById } from '@/db/jurisdictions';
import { parsePositiveInt } from '@/lib/domain/integers';
import { findPlanRevision } from '@/db/plan-revisions';
import { PlanEditor } from '@/components/plan-editor/plan-editor';
import { ProjectHeader } from '@/components/projects/project-header';
import { SafetyNotice } from '@/components/ui/safety-notice';
import { defaultParameters } from '@/lib/domain/params';
import { findOversizeLists, truncateToLimits, type PlanInput } from '@/lib/domain/plan';
import { loadProjectPage } from '@/lib/services/projects/project-page';
import { findRuleSetById } from '@/db/rule-sets';
import { findCheck, listChecks } from '@/db/checks';
import { failingBySection } from '@/lib/domain/checks/sections';
import type { SectionStatus } from '@/components/plan-editor/section-status';

export const metadata: Metadata = { title: 'Plan' };

export default async function PlanPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ revision?: string }> }) {
  const { id } = await params;
  const { revision: revParam } = await searchParams;
  const { user, project, published } = await loadProjectPage(id, `/projects/${id}/plan`);
  const db = getDb();
  const wanted = revParam ? parsePositiveInt(revParam) : 'latest';
  if (wanted === null) notFound();
  const [revision, latest] = await Promise.all([findPlanRevision(db, user, id, wanted), findPlanRevision(db, user, id, 'latest')]);
  if (wanted !== 'latest' && !revision) notFound();
  const rules = published ? await findRuleSetById(db, published.id) : null;
  const jurisdiction = await findJurisdictionById(db, project.jurisdiction.id);
  if (!jurisdiction) notFound();
  // The live route totals use the published parameters; before a first publication, the model-code defaults.
  const parameters = rules?.parameters ?? defaultParameters(jurisdiction.editions);
  const viewingOld = revision && latest && revision.number !== latest.number;
  // A revision saved before the list limits opens cut to them, so the editor stays usable; the stored row is untouched.
  const oversize = revision ? findOversizeLists(revision.plan) : [];
  const initialPlan = revision ? (truncateToLimits(revision.plan) as PlanInput) : null;
  const sectionStatus = await latestCheckStatus(db, user, id);

  return (
    <>
      <ProjectHeader project={project} current="/plan" />
      {viewingOld && (
        <p role="status" className="mb-4 rounded-md border border-brass bg-brass-soft/50 px-4 py-3 text-sm">
          You are looking at revision {revision!.number}. Saving makes it revision {latest!.number + 1}; revision {latest!.number} stays as it is.{' '}
          <Link href={`/projects/${id}/plan`} className="underline">Open the latest instead</Link>
        </p>
      )}
      {oversize.length > 0 && (
        <div role="alert" className="mb-4 rounded-md border border-status-fail/50 bg-white px-4 py-3 text-sm" data-testid="plan-oversize">
          <p className="font-semibold">Revision {revision!.number} holds more than a plan may have today, so the editor shows only the first entries of these lists:</p>
          <ul className="mt-1 list-disc pl-5">
            {oversize.map((o) => <li key={o.path}>{o.message}</li>)}
          </ul>
          <p className="mt-1">Saving makes a new revision with what the editor shows; revision {revision!.number} stays as it was saved.</p>
        </div>
      )}
      {user.role !== 'installer' && <p className="mb-4 text-sm text-ink-soft">Admins can read plans; only the company’s installers save them.</p>}
      <div className="mb-5"><SafetyNotice compact /></div>
      <PlanEditor
        key={revParam ? `revision-${revParam}` : 'latest'}
        projectId={project.id}
        initialPlan={initialPlan}
        saveBeforeCheck={oversize.length > 0}
        baseRevision={latest?.number ?? null}
        params={parameters}
        sectionStatus={sectionStatus}
        live={{ jurisdiction: project.jurisdiction.slug, version: published?.version ?? null }}
      />
    </>
  );
}

/** Failing findings per editor section from the project's latest stored check (the live check replaces them). */
async function latestCheckStatus(db: ReturnType<typeof getDb>, user: Parameters<typeof listChecks>[1], projectId: string): Promise<SectionStatus> {
  const [latest] = await listChecks(db, user, projectId);
  const check = latest ? await findCheck(db, user, latest.id) : null;
  if (!check) return { source: 'none', failBySection: {} };
  const ruleSet = await findRuleSetById(db, check.ruleSet.id);
  return {
    source: 'stored',
    failBySection: failingBySection(check.findings, ruleSet?.rules ?? []),
    caption: `from the check of revision ${check.planRevision.number}`,
  };
}
