import { sql } from 'kysely';
import { isUuid } from '@/lib/domain/ids';
import type { DB } from '@/db/index';
import { writeAudit } from '@/db/audit';
import { demoPlans } from '@/db/demo-plans';
import { findJurisdictionBySlug, insertJurisdiction, listJurisdictions, type Jurisdiction, type JurisdictionFields } from '@/db/jurisdictions';
import { getPublishedRuleSet, getRuleSetById, insertDraft, publishWithin, withConflicts, type RuleSetVersion, type RuleSetWithRules } from '@/db/rule-sets';
import { outcomeOf } from '@/lib/domain/checks/outcome';
import { compareFindingSets, summarizeComparisons, type FindingDelta, type Outcome, type SubjectComparison } from '@/lib/domain/rule-sets/dry-run';
import { evaluate, type Evaluation, type EvaluationSummary, type Finding } from '@/lib/domain/engine';
import { ConflictError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import { parsePlan } from '@/lib/domain/plan';
import type { RuleSetParameters } from '@/lib/domain/params';
import { buildRuleSet } from '@/rules';
import { type StoredRule } from '@/lib/domain/rule-format';

export type DraftSource = { from: 'published' } | { from: 'baseline' } | { from: 'version'; ruleSetId: string };

/**
 * What a new draft starts from: a full copy of the jurisdiction's published version, the model
 * codes for its adopted editions (no amendments), or any published or retired version, also
 * another jurisdiction's. A copy from elsewhere takes this jurisdiction's editions; the draft
 * page then lists citations that name editions it did not adopt.
 */
export async function resolveDraftSource(
  db: DB,
  jurisdiction: Jurisdiction,
  source: DraftSource,
): Promise<{ parameters: RuleSetParameters; rules: StoredRule[]; basedOnId: string | null; label: string }> {
  if (source.from === 'baseline') {
    const built = buildRuleSet(jurisdiction.editions);
    return { parameters: built.parameters, rules: built.rules, basedOnId: null, label: `baseline for ${jurisdiction.editions.building}, ${jurisdiction.editions.electrical}, ${jurisdiction.editions.plumbing}` };
  }
  const copy = source.from === 'published' ? await getPublishedRuleSet(db, jurisdiction.id) : await getRuleSetById(db, source.ruleSetId);
  if (!copy) {
    if (source.from === 'published') throw new ConflictError(`${jurisdiction.name} has no published version to copy; start from the baseline instead.`);
    throw new ValidationError([{ path: 'ruleSetId', message: 'No such rule set version.' }]);
  }
  if (copy.status === 'draft') throw new ValidationError([{ path: 'ruleSetId', message: 'Copy a published or retired version, not another draft.' }]);
  const parameters = copy.jurisdictionId === jurisdiction.id ? copy.parameters : { ...copy.parameters, editions: { ...jurisdiction.editions } };
  return { parameters, rules: copy.rules, basedOnId: copy.id, label: `copy of ${copy.jurisdictionSlug} version ${copy.version}` };
}

/** A new jurisdiction and its first draft, in one transaction, both audited. */
export async function createJurisdictionWithDraft(
  db: DB,
  input: JurisdictionFields & { slug: string; startFrom: string; publishChangelog?: string },
  actorUserId: string,
  validate: (draft: RuleSetWithRules) => void = () => {},
): Promise<{ jurisdiction: Jurisdiction; draft: RuleSetVersion }> {
  let source: DraftSource = { from: 'baseline' };
  if (input.startFrom !== 'baseline') {
    const other = await findJurisdictionBySlug(db, input.startFrom);
    const published = other ? await getPublishedRuleSet(db, other.id) : null;
    if (!published) throw new ValidationError([{ path: 'startFrom', message: `'${input.startFrom}' has no published rule set to start from; choose another or the baseline.` }]);
    source = { from: 'version', ruleSetId: published.id };
  }
  return withConflicts(() =>
    db.transaction().execute(async (trx) => {
      const { startFrom: _s, publishChangelog, ...fields } = input;
      const jurisdiction = await insertJurisdiction(trx, fields);
      await writeAudit(trx, {
        actorUserId,
        action: 'jurisdiction.create',
        entityType: 'jurisdiction',
        entityId: jurisdiction.id,
        details: { jurisdictionId: jurisdiction.id, slug: jurisdiction.slug, editions: jurisdiction.editions, startFrom: input.startFrom },
      });
      const start = await resolveDraftSource(trx, jurisdiction, source);
      const draft = await insertDraft(trx, { jurisdictionId: jurisdiction.id, ...start, actorUserId, source: start.label });
      // Adopting the starting rules as they are: published in the same transaction, so the
      // jurisdiction never appears without a published version.
      if (publishChangelog) {
        await publishWithin(trx, { id: draft.id, revision: draft.revision, changelog: publishChangelog, actorUserId, validate });
        return { jurisdiction, draft: (await getRuleSetById(trx, draft.id))! };
      }
      return { jurisdiction, draft };
    }),
  );
}

export type JurisdictionOverview = Jurisdiction & {
  published: { id: string; version: number; publishedAt: Date | null } | null;
  draft: { id: string; version: number; updatedAt: Date } | null;
  versions: number;
  projects: number;
};

export async function listJurisdictionOverview(db: DB): Promise<JurisdictionOverview[]> {
  const [list, sets, projects] = await Promise.all([
    listJurisdictions(db),
    db.selectFrom('rule_sets').select(['id', 'jurisdiction_id', 'version', 'status', 'published_at', 'updated_at']).execute(),
    db
      .selectFrom('projects')
      .select((eb) => ['jurisdiction_id', eb.fn.countAll<number>().as('n')])
      .where('archived_at', 'is', null)
      .groupBy('jurisdiction_id')
      .execute(),
  ]);
  return list.map((j) => {
    const mine = sets.filter((s) => s.jurisdiction_id === j.id);
    const pub = mine.find((s) => s.status === 'published');
    const draft = mine.find((s) => s.status === 'draft');
    return {
      ...j,
      published: pub ? { id: pub.id, version: pub.version, publishedAt: pub.published_at } : null,
      draft: draft ? { id: draft.id, version: draft.version, updatedAt: draft.updated_at } : null,
      versions: mine.length,
      projects: Number(projects.find((p) => p.jurisdiction_id === j.id)?.n ?? 0),
    };
  });
}

export type AuditItem = { id: number; at: Date; action: string; actorEmail: string | null; entityId: string | null; details: Record<string, unknown> };

/** The audit trail of one jurisdiction: its own edits and everything done to its rule set versions. */
export async function listJurisdictionAudit(db: DB, jurisdictionId: string, limit = 100): Promise<AuditItem[]> {
  const rows = await db
    .selectFrom('audit_log as a')
    .leftJoin('users as u', 'u.id', 'a.actor_user_id')
    .select(['a.id', 'a.at', 'a.action', 'a.entity_id', 'a.details', 'u.email'])
    .where((eb) =>
      eb.or([
        eb(sql<string>`a.details->>'jurisdictionId'`, '=', jurisdictionId),
        eb.and([eb('a.entity_type', '=', 'jurisdiction'), eb('a.entity_id', '=', jurisdictionId)]),
      ]),
    )
    .where('a.entity_type', 'in', ['jurisdiction', 'rule_set'])
    .orderBy('a.id', 'desc')
    .limit(limit)
    .execute();
  return rows.map((r) => ({ id: r.id, at: r.at, action: r.action, actorEmail: r.email, entityId: r.entity_id, details: r.details }));
}

function forEvaluation(set: RuleSetWithRules) {
  // Only immutable versions may be cached by id in the engine; a draft changes between runs.
  return { id: set.status === 'draft' ? undefined : set.id, jurisdiction: set.jurisdictionSlug, version: set.version, parameters: set.parameters, rules: set.rules };
}

async function evaluateSafely(set: RuleSetWithRules, plan: Parameters<typeof evaluate>[1]): Promise<{ evaluation: Evaluation | null; error: string | null }> {
  try {
    return { evaluation: await evaluate(forEvaluation(set), plan), error: null };
  } catch (err) {
    // A draft rule can still trip the engine at run time; report it against the subject, don't fail the whole run.
    return { evaluation: null, error: `version ${set.version} could not evaluate this plan: ${(err as Error).message}` };
  }
}

const side = (e: Evaluation | null): { outcome: Outcome; summary: EvaluationSummary } | null => (e ? { outcome: outcomeOf(e.summary), summary: e.summary } : null);

async function compareSubject(
  subject: Pick<SubjectComparison, 'kind' | 'id' | 'name' | 'detail'>,
  plan: unknown,
  before: RuleSetWithRules | null,
  after: RuleSetWithRules,
): Promise<SubjectComparison> {
  const parsed = parsePlan(plan);
  if (!parsed.ok) {
    return { ...subject, before: null, after: null, changes: [], error: `The plan does not parse today: ${parsed.errors.slice(0, 3).map((e) => `${e.path}: ${e.message}`).join('; ')}` };
  }
  const a = before ? await evaluateSafely(before, parsed.plan) : { evaluation: null, error: null };
  const b = await evaluateSafely(after, parsed.plan);
  const changes = b.evaluation ? compareFindingSets(a.evaluation?.findings ?? [], b.evaluation.findings) : [];
  return { ...subject, before: side(a.evaluation), after: side(b.evaluation), changes, error: a.error ?? b.error };
}

type ProjectPlanRow = { id: string; name: string; organization: string; revisionNumber: number; plan: unknown };

async function latestRevisions(db: DB, jurisdictionId: string): Promise<ProjectPlanRow[]> {
  const rows = await db
    .selectFrom('projects as p')
    .innerJoin('organizations as o', 'o.id', 'p.organization_id')
    .innerJoinLateral(
      (eb) => eb.selectFrom('plan_revisions as r').select(['r.number', 'r.plan']).whereRef('r.project_id', '=', 'p.id').orderBy('r.number', 'desc').limit(1).as('lr'),
      (join) => join.onTrue(),
    )
    .select(['p.id', 'p.name', 'o.name as organization', 'lr.number', 'lr.plan'])
    .where('p.jurisdiction_id', '=', jurisdictionId)
    .where('p.archived_at', 'is', null)
    .orderBy('p.name')
    .execute();
  return rows.map((r) => ({ id: r.id, name: r.name, organization: r.organization, revisionNumber: r.number, plan: r.plan }));
}

export type DryRunResult = {
  draft: { id: string; version: number; revision: number };
  published: { id: string; version: number } | null;
  subjects: SubjectComparison[];
  totals: ReturnType<typeof summarizeComparisons>;
};

/**
 * Evaluates the demo plans and the latest plan revision of every open project in the
 * jurisdiction under both the published version and the draft, and reports the findings that
 * would change. Nothing is stored but the audit entry.
 */
export async function runDryRun(db: DB, draftId: string, actorUserId: string): Promise<DryRunResult> {
  const draft = await getRuleSetById(db, draftId);
  if (!draft) throw new NotFoundError('No such rule set version.');
  const published = await getPublishedRuleSet(db, draft.jurisdictionId);
  const baseline = published && published.id !== draft.id ? published : null;
  const subjects: SubjectComparison[] = [];
  for (const demo of demoPlans) {
    subjects.push(await compareSubject({ kind: 'demo-plan', id: demo.slug, name: demo.name, detail: 'demo plan' }, demo.plan, baseline, draft));
  }
  for (const p of await latestRevisions(db, draft.jurisdictionId)) {
    subjects.push(await compareSubject({ kind: 'project', id: p.id, name: p.name, detail: `${p.organization} · plan revision ${p.revisionNumber}` }, p.plan, baseline, draft));
  }
  const totals = summarizeComparisons(subjects);
  await writeAudit(db, {
    actorUserId,
    action: 'rule-set.dry-run',
    entityType: 'rule_set',
    entityId: draft.id,
    details: { jurisdictionId: draft.jurisdictionId, version: draft.version, revision: draft.revision, againstVersion: baseline?.version ?? null, totals },
  });
  return {
    draft: { id: draft.id, version: draft.version, revision: draft.revision },
    published: baseline ? { id: baseline.id, version: baseline.version } : null,
    subjects,
    totals,
  };
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
export async function computeImpact(db: DB, jurisdictionId: string): Promise<{ published: { id: string; version: number; changelog: string } | null; items: ImpactItem[] }> {
  const published = await getPublishedRuleSet(db, jurisdictionId);
  const rows = await db
    .selectFrom('projects as p')
    .innerJoin('organizations as o', 'o.id', 'p.organization_id')
    .leftJoinLateral(
      (eb) =>
        eb
          .selectFrom('checks as c')
          .innerJoin('rule_sets as s', 's.id', 'c.rule_set_id')
          .innerJoin('plan_revisions as r', 'r.id', 'c.plan_revision_id')
          .select(['c.id as check_id', 'c.outcome', 'c.findings', 'c.inputs', 'c.created_at as checked_at', 's.version', 'r.number as revision_number'])
          .whereRef('c.project_id', '=', 'p.id')
          .orderBy('c.created_at', 'desc')
          .limit(1)
          .as('lc'),
      (join) => join.onTrue(),
    )
    .select(['p.id', 'p.name', 'o.name as organization', 'lc.check_id', 'lc.outcome', 'lc.findings', 'lc.inputs', 'lc.checked_at', 'lc.version', 'lc.revision_number'])
    .where('p.jurisdiction_id', '=', jurisdictionId)
    .where('p.archived_at', 'is', null)
    .orderBy('p.name')
    .execute();
  const items: ImpactItem[] = [];
  for (const r of rows) {
    const base = { projectId: r.id, name: r.name, organization: r.organization };
    if (!r.check_id) {
      items.push({ ...base, state: 'never-checked', latestCheck: null, outcomeNow: null, changes: [], error: null });
      continue;
    }
    const latestCheck = { id: r.check_id, version: r.version!, outcome: r.outcome!, createdAt: r.checked_at!, revisionNumber: r.revision_number! };
    if (!published || r.version! >= published.version) {
      items.push({ ...base, state: 'current', latestCheck, outcomeNow: latestCheck.outcome, changes: [], error: null });
      continue;
    }
    const parsed = parsePlan((r.inputs as { plan?: unknown } | null)?.plan);
    if (!parsed.ok) {
      items.push({ ...base, state: 'would-change', latestCheck, outcomeNow: null, changes: [], error: 'The checked plan does not parse today; the installer needs to re-save it.' });
      continue;
    }
    const now = await evaluateSafely(published, parsed.plan);
    const changes = now.evaluation ? compareFindingSets(r.findings as Finding[], now.evaluation.findings) : [];
    const outcomeNow = now.evaluation ? outcomeOf(now.evaluation.summary) : null;
    const differs = changes.some((c) => c.statusChanged) || outcomeNow !== latestCheck.outcome || !!now.error;
    items.push({ ...base, state: differs ? 'would-change' : 'unchanged', latestCheck, outcomeNow, changes, error: now.error });
  }
  return { published: published ? { id: published.id, version: published.version, changelog: published.changelog } : null, items };
}


/** A rule set version by id for the admin routes; a malformed id is a 404 like any unknown one. */
export async function requireRuleSet(db: DB, id: string): Promise<RuleSetWithRules> {
  const set = isUuid(id) ? await getRuleSetById(db, id) : null;
  if (!set) throw new NotFoundError('No such rule set version.');
  return set;
}

export async function requireJurisdiction(db: DB, slug: string): Promise<Jurisdiction> {
  const j = await findJurisdictionBySlug(db, slug);
  if (!j) throw new NotFoundError(`No jurisdiction '${slug}'.`);
  return j;
}
