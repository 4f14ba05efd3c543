import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb, type DB } from '@/db';
import { parsePositiveInt } from '@/lib/domain/integers';
import { findCheck, listChecks } from '@/db/checks';
import { findJurisdictionBySlug } from '@/db/jurisdictions';
import { findPlanRevision } from '@/db/plan-revisions';
import { findRuleSetById, type RuleSetVersion } from '@/db/rule-sets';
import { DrawingFigure } from '@/components/drawings/drawing-figure';
import { HingeLayoutSection } from '@/components/drawings/hinge-layout-section';
import { PrintButton } from '@/components/drawings/print-button';
import { ProjectHeader } from '@/components/projects/project-header';
import { EmptyState } from '@/components/ui/empty-state';
import { SafetyNotice } from '@/components/ui/safety-notice';
import { drawPlan } from '@/lib/domain/drawing';
import { defaultParameters, ruleSetParametersSchema, type RuleSetParameters } from '@/lib/domain/params';
import { parseStoredPlan } from '@/lib/domain/plan';
import { loadProjectPage } from '@/lib/services/projects/project-page';
import { formatDateTime } from '@/lib/domain/dates/format';

export const metadata: Metadata = { title: 'Drawing' };

// A broken stored plan may have an error per list item; the page lists the first few.
const ERRORS_SHOWN = 20;

// The full-size templates are 7 × 9-1/2 in; these margins leave room on Letter and A4 alike.
const PRINT_CSS = '@media print { @page { margin: 0.4in; } }';

/**
 * The thresholds to draw against: the rule set the check ran on, else the jurisdiction's
 * published one, else the model-code defaults for its editions.
 */
async function loadParameters(db: DB, ruleSetId: string | null, published: RuleSetVersion | null, jurisdictionSlug: string): Promise<RuleSetParameters> {
  const stored = ruleSetId ? (await findRuleSetById(db, ruleSetId))?.parameters : published?.parameters;
  const valid = stored ? ruleSetParametersSchema.safeParse(stored) : null;
  if (valid?.success) return valid.data;
  const jurisdiction = await findJurisdictionBySlug(db, jurisdictionSlug);
  if (!jurisdiction) notFound();
  return defaultParameters(jurisdiction.editions);
}

export default async function DrawingPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ revision?: string }> }) {
  const { id } = await params;
  const { revision: revParam } = await searchParams;
  const { user, project, published } = await loadProjectPage(id, `/projects/${id}/drawing`);
  const db = getDb();
  const wanted = revParam ? parsePositiveInt(revParam) : 'latest';
  if (wanted === null) notFound();
  const [revision, checks] = await Promise.all([findPlanRevision(db, user, id, wanted), listChecks(db, user, id)]);
  if (wanted !== 'latest' && !revision) notFound();

  if (!revision) {
    return (
      <>
        <ProjectHeader project={project} current="/drawing" />
        <EmptyState
          title="No plan to draw yet"
          action={user.role === 'installer' ? <Link href={`/projects/${project.id}/plan`} className="btn-primary">Describe the closet</Link> : undefined}
        >
          The drawings are made from the saved plan: the enclosure, the washer and dryer, the exhaust route and the doors. Save a plan and they appear here.
        </EmptyState>
      </>
    );
  }

  const parsed = parseStoredPlan(revision.plan);
  const refusal = (title: string, reasons: string[], why: string) => (
    <>
      <ProjectHeader project={project} current="/drawing" />
      <div role="alert" className="card border-status-fail/40 p-5" data-testid="drawing-refused">
        <h2 className="font-bold">{title}</h2>
        <ul className="mt-2 list-disc pl-5 text-sm">
          {reasons.slice(0, ERRORS_SHOWN).map((message, i) => <li key={i}>{message}</li>)}
          {reasons.length > ERRORS_SHOWN && <li>and {(reasons.length - ERRORS_SHOWN).toLocaleString('en-US')} more</li>}
        </ul>
        <p className="mt-2 text-sm text-ink-soft">{why}</p>
        <Link href={`/projects/${project.id}/plan?revision=${revision.number}`} className="btn-secondary mt-3">Open it in the plan editor</Link>
      </div>
    </>
  );
  const fixIt = `Revision ${revision.number} stays as it was saved; correct the plan in the editor and save it as a new revision to draw it.`;
  // Too large first: a revision saved before the plan limits is refused by its size, before anything is drawn.
  if (parsed.oversize.length > 0) {
    return refusal(`Revision ${revision.number} is too large to draw`, parsed.oversize.map((o) => o.message), fixIt);
  }
  if (!parsed.ok) return refusal(`Revision ${revision.number} cannot be drawn as saved`, parsed.errors.map((e) => e.message), fixIt);
  const plan = parsed.plan;

  // Failures are marked only from a check of this very revision; the newest one wins (listChecks is newest first).
  const checkOfRevision = checks.find((c) => c.planRevision.number === revision.number) ?? null;
  const [check, parameters] = await Promise.all([
    checkOfRevision ? findCheck(db, user, checkOfRevision.id) : Promise.resolve(null),
    loadParameters(db, checkOfRevision?.ruleSet.id ?? checks[0]?.ruleSet.id ?? null, published, project.jurisdiction.slug),
  ]);
  const options = { params: parameters, marks: check?.findings ?? [] };

  const drawn = drawPlan(plan, options);
  if (!drawn.ok) return refusal(`Revision ${revision.number} is too large to draw`, drawn.reasons, fixIt);
  const { elevation, planView: planDrawing, exhaust, hinges } = drawn.drawings;
  const latestNumber = project.latestRevision;
  const viewingOld = latestNumber !== null && revision.number !== latestNumber;

  return (
    <>
      <style>{PRINT_CSS}</style>
      <ProjectHeader project={project} current="/drawing" />
      <div className="mb-4 flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 className="text-xl font-bold">Drawings of plan revision {revision.number}</h2>
          <p className="text-sm text-ink-soft" data-testid="drawing-meta">
            {check
              ? `Marked from the check of ${formatDateTime(check.createdAt, project.jurisdiction.timeZone)} (${project.jurisdiction.name} rules v${check.ruleSet.version}).`
              : checks.length > 0
                ? `No check of revision ${revision.number} yet, so nothing is marked; the latest check is of revision ${checks[0].planRevision.number}.`
                : 'No check has run yet, so nothing is marked.'}
          </p>
        </div>
        <div className="no-print flex flex-wrap gap-2">
          <Link href={`/projects/${project.id}/plan?revision=${revision.number}`} className="btn-secondary">Plan</Link>
          {check && <Link href={`/projects/${project.id}/checks/${check.id}`} className="btn-secondary">Check</Link>}
          <PrintButton label="Print drawings and templates" />
        </div>
      </div>

      {viewingOld && (
        <p role="status" className="no-print mb-4 rounded-md border border-brass bg-brass-soft/50 px-4 py-3 text-sm">
          You are looking at revision {revision.number}; the latest is {latestNumber}.{' '}
          <Link href={`/projects/${project.id}/drawing`} className="underline">Draw the latest instead</Link>
        </p>
      )}

      <div className="mb-6"><SafetyNotice compact /></div>

      <div className="grid gap-6 lg:grid-cols-2">
        <DrawingFigure drawing={elevation} id="front-elevation" />
        <DrawingFigure drawing={planDrawing} id="plan-view" />
      </div>

      <div className="mt-6">
        <DrawingFigure drawing={exhaust} id="exhaust-schematic" />
      </div>

      <section className="mt-8 space-y-6" aria-labelledby="hinges-h">
        <h2 id="hinges-h" className="text-xl font-bold print:break-before-page">Hinge and mounting-plate layout</h2>
        {hinges.length === 0 ? (
          <p className="text-sm text-ink-soft">
            {plan.doors && plan.doors.length > 0 ? 'No hinged doors in the plan: bifold and sliding doors need no cup-hinge layout.' : 'No doors in the plan yet.'}
          </p>
        ) : (
          hinges.map((layout) => <HingeLayoutSection key={layout.doorIndex} layout={layout} units={plan.units} />)
        )}
      </section>
    </>
  );
}
