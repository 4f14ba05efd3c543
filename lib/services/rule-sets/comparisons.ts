import 'server-only';
import type { DB } from '@/db';
import { writeAudit } from '@/db/audit';
import { listLatestChecksInJurisdiction } from '@/db/checks';
import { demoPlans } from '@/db/demo-plans';
import { listLatestPlansInJurisdiction } from '@/db/plan-revisions';
import { findPublishedRuleSet, findRuleSetById, type RuleSetWithRules } from '@/db/rule-sets';
import { outcomeOf } from '@/lib/domain/checks/outcome';
import type { Evaluation, EvaluationSummary } from '@/lib/domain/engine';
import { NotFoundError } from '@/lib/domain/errors';
import { adminNotesFor } from '@/lib/domain/rule-format';
import { compareFindingSets, summarizeComparisons, type FindingDelta, type Outcome, type SubjectComparison } from '@/lib/domain/rule-sets/dry-run';
import { evaluateForComparison } from '@/lib/services/evaluation';
import { buildRuleSet } from '@/rules';

const side = (e: Evaluation | null): { outcome: Outcome; summary: EvaluationSummary } | null => (e ? { outcome: outcomeOf(e.summary), summary: e.summary } : null);

async function compareSubject(
  subject: Pick<SubjectComparison, 'kind' | 'id' | 'name' | 'detail'>,
  plan: unknown,
  before: RuleSetWithRules | null,
  after: RuleSetWithRules,
): Promise<SubjectComparison> {
  const result = await evaluateForComparison(plan, { before, after });
  if (result.parseError) return { ...subject, before: null, after: null, changes: [], error: `The plan does not parse today: ${result.parseError}` };
  const changes = result.after ? compareFindingSets(result.before?.findings ?? [], result.after.findings) : [];
  return { ...subject, before: side(result.before), after: side(result.after), changes, error: result.error };
}

/**
 * The built-in rules and parameters for the editions a version was written for: what a first
 * version is compared with before anything is published. Version 0 and no id, so it is never
 * mistaken for a stored version or cached as one.
 */
export function baselineRuleSet(set: Pick<RuleSetWithRules, 'jurisdictionId' | 'jurisdictionSlug' | 'parameters'>): RuleSetWithRules {
  const built = buildRuleSet(set.parameters.editions);
  const now = new Date(0);
  return {
    id: '',
    jurisdictionId: set.jurisdictionId,
    jurisdictionSlug: set.jurisdictionSlug,
    version: 0,
    status: 'draft',
    parameters: built.parameters,
    changelog: '',
    revision: 0,
    publishedAt: null,
    createdAt: now,
    updatedAt: now,
    basedOnId: null,
    retiredAt: null,
    createdBy: null,
    publishedBy: null,
    rules: built.rules,
  };
}

/** What a dry run compared the draft with: the published version, or the model-code baseline before the first publication. */
export type ComparedWith = { kind: 'published'; version: number } | { kind: 'baseline'; editions: string };

export const baselineLabel = (set: Pick<RuleSetWithRules, 'parameters'>) =>
  `the model-code baseline (${[set.parameters.editions.building, set.parameters.editions.electrical, set.parameters.editions.plumbing].join(', ')}, no local amendments)`;

export type DryRunResult = {
  draft: { id: string; version: number; revision: number };
  published: { id: string; version: number } | null;
  comparedWith: ComparedWith;
  subjects: SubjectComparison[];
  totals: ReturnType<typeof summarizeComparisons>;
  /** What the draft's rules ask an admin to fix (never shown to installers). */
  adminNotes: ReturnType<typeof adminNotesFor>;
};

/**
 * Called while a comparison works through its subjects: after every `batchSize` of them and at the end, with how
 * many are done of how many. The loop also yields to the event loop there, so a long run in an app server's
 * worker never holds up the requests that server answers.
 */
export type ComparisonProgress = { batchSize: number; onBatch: (done: number, total: number) => Promise<void> };

async function progressed(progress: ComparisonProgress | undefined, done: number, total: number): Promise<void> {
  if (!progress || (done % progress.batchSize !== 0 && done !== total)) return;
  await new Promise<void>((resolve) => setImmediate(resolve));
  await progress.onBatch(done, total);
}

/**
 * Evaluates the demo plans and the latest plan revision of every open project in the jurisdiction under both the
 * published version and the draft, and reports the findings that would change. Stores nothing; `runDryRun` adds
 * the audit entry, the dry-run job adds it with the stored result.
 */
export async function evaluateDryRun(db: DB, draftId: string, progress?: ComparisonProgress): Promise<DryRunResult> {
  const draft = await findRuleSetById(db, draftId);
  if (!draft) throw new NotFoundError('No such rule set version.');
  const published = await findPublishedRuleSet(db, draft.jurisdictionId);
  // Before the first publication the draft is compared with the model-code baseline it started
  // from, so only what the admin changed shows, not every rule as new.
  const current = published && published.id !== draft.id ? published : null;
  const baseline = current ?? baselineRuleSet(draft);
  const projects = await listLatestPlansInJurisdiction(db, draft.jurisdictionId);
  const total = demoPlans.length + projects.length;
  const subjects: SubjectComparison[] = [];
  await progressed(progress, 0, total);
  for (const demo of demoPlans) {
    subjects.push(await compareSubject({ kind: 'demo-plan', id: demo.slug, name: demo.name, detail: 'demo plan' }, demo.plan, baseline, draft));
    await progressed(progress, subjects.length, total);
  }
  for (const p of projects) {
    subjects.push(await compareSubject({ kind: 'project', id: p.id, name: p.name, detail: `${p.organization} · plan revision ${p.revisionNumber}` }, p.plan, baseline, draft));
    await progressed(progress, subjects.length, total);
  }
  return {
    draft: { id: draft.id, version: draft.version, revision: draft.revision },
    published: current ? { id: current.id, version: current.version } : null,
    comparedWith: current ? { kind: 'published', version: current.version } : { kind: 'baseline', editions: baselineLabel(draft) },
    subjects,
    totals: summarizeComparisons(subjects),
    adminNotes: adminNotesFor(draft.rules),
  };
}

/** The audit entry of one dry run, written by whoever asked for it (the request, or the job with its result). */
export async function auditDryRun(db: DB, actorUserId: string, jurisdictionId: string, result: DryRunResult): Promise<void> {
  await writeAudit(db, {
    actorUserId,
    action: 'rule-set.dry-run',
    entityType: 'rule_set',
    entityId: result.draft.id,
    details: {
      jurisdictionId,
      version: result.draft.version,
      revision: result.draft.revision,
      againstVersion: result.published?.version ?? null,
      againstBaseline: !result.published,
      totals: result.totals,
    },
  });
}

/** A dry run while the caller waits, with its audit entry (`POST /api/rule-sets/<id>/dry-run`). */
export async function runDryRun(db: DB, draftId: string, actorUserId: string): Promise<DryRunResult> {
  const draft = await findRuleSetById(db, draftId);
  if (!draft) throw new NotFoundError('No such rule set version.');
  const result = await evaluateDryRun(db, draft.id);
  await auditDryRun(db, actorUserId, draft.jurisdictionId, result);
  return result;
}

export type ImpactItem = {
  projectId: string;
  name: string;
  organization: string;
  state: 'would-change' | 'unchanged' | 'current' | 'never-checked';
  latestCheck: { id: string; version: number; outcome: Outcome; createdAt: Date; revisionNumber: number } | null;
  outcomeNow: Outcome | null;
  changes: FindingDelta[];
  error: string | null;
};

/**
 * After publishing: for each open project, would its latest check come out differently under the
 * published version? The check's own stored plan is re-evaluated (it stays as it was; the
 * installer sees that newer rules exist and re-runs).
 */
export type ImpactResult = { published: { id: string; version: number; changelog: string } | null; items: ImpactItem[]; adminNotes: ReturnType<typeof adminNotesFor> };

export async function computeImpact(db: DB, jurisdictionId: string, progress?: ComparisonProgress): Promise<ImpactResult> {
  const published = await findPublishedRuleSet(db, jurisdictionId);
  const items: ImpactItem[] = [];
  const projects = await listLatestChecksInJurisdiction(db, jurisdictionId);
  await progressed(progress, 0, projects.length);
  for (const project of projects) {
    await impactOf(project);
    await progressed(progress, items.length, projects.length);
  }
  return {
    published: published ? { id: published.id, version: published.version, changelog: published.changelog } : null,
    items,
    adminNotes: published ? adminNotesFor(published.rules) : [],
  };

  async function impactOf(project: (typeof projects)[number]): Promise<void> {
    const base = { projectId: project.projectId, name: project.name, organization: project.organization };
    const stored = project.latestCheck;
    if (!stored) {
      items.push({ ...base, state: 'never-checked', latestCheck: null, outcomeNow: null, changes: [], error: null });
      return;
    }
    const latestCheck = { id: stored.id, version: stored.version, outcome: stored.outcome, createdAt: stored.createdAt, revisionNumber: stored.revisionNumber };
    if (!published || stored.version >= published.version) {
      items.push({ ...base, state: 'current', latestCheck, outcomeNow: latestCheck.outcome, changes: [], error: null });
      return;
    }
    const now = await evaluateForComparison(stored.plan, { before: null, after: published });
    if (now.parseError) {
      items.push({ ...base, state: 'would-change', latestCheck, outcomeNow: null, changes: [], error: 'The checked plan does not parse today; the installer needs to re-save it.' });
      return;
    }
    const changes = now.after ? compareFindingSets(stored.findings, now.after.findings) : [];
    const outcomeNow = now.after ? outcomeOf(now.after.summary) : null;
    const differs = changes.some((c) => c.statusChanged) || outcomeNow !== latestCheck.outcome || !!now.error;
    items.push({ ...base, state: differs ? 'would-change' : 'unchanged', latestCheck, outcomeNow, changes, error: now.error });
  }
}
