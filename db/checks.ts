import type { DB } from '@/db/index';
import { isUuid } from '@/lib/domain/ids';
import { writeAudit } from '@/db/audit';
import { outcomeOf, type CheckOutcome } from '@/lib/domain/checks/outcome';
import type { AppUser } from '@/lib/domain/roles';
import type { Evaluation, EvaluationSummary, Finding } from '@/lib/domain/engine';
import { getProject } from '@/db/projects';
import { CHECK_SCHEMA_VERSION, readStoredCheck } from '@/lib/domain/checks/stored';
import { PLAN_SCHEMA_VERSION } from '@/lib/domain/plan/upgrade';

export type StoredCheck = {
  id: string;
  projectId: string;
  planRevision: { id: string; number: number };
  ruleSet: { id: string; version: number; jurisdiction: string; changelog: string; status: string };
  /** The plan evaluated, in today's plan shape, and its canonical form as the engine saw it. */
  inputs: { plan: unknown; canonical: unknown };
  facts: Record<string, unknown>;
  findings: Finding[];
  summary: EvaluationSummary;
  outcome: CheckOutcome;
  durationMs: number;
  createdBy: { id: string | null; name: string | null };
  createdAt: Date;
};

export type CheckListItem = Omit<StoredCheck, 'inputs' | 'facts' | 'findings'>;

function checkQuery(db: DB) {
  return db
    .selectFrom('checks as c')
    .innerJoin('plan_revisions as r', 'r.id', 'c.plan_revision_id')
    .innerJoin('rule_sets as s', 's.id', 'c.rule_set_id')
    .innerJoin('jurisdictions as j', 'j.id', 's.jurisdiction_id')
    .leftJoin('users as u', 'u.id', 'c.created_by')
    .select([
      'c.id', 'c.project_id', 'c.inputs', 'c.facts', 'c.findings', 'c.summary', 'c.schema_version', 'c.outcome', 'c.duration_ms', 'c.created_by', 'c.created_at',
      'r.id as revision_id', 'r.number as revision_number',
      's.id as rule_set_id', 's.version as rule_set_version', 's.changelog as rule_set_changelog', 's.status as rule_set_status',
      'j.slug as jurisdiction_slug', 'u.name as created_by_name',
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof checkQuery>['executeTakeFirstOrThrow']>>;

/** A check as stored, in today's shape: never re-evaluated. */
function toCheck(r: Row): StoredCheck {
  const stored = readStoredCheck({ inputs: r.inputs, facts: r.facts, findings: r.findings, summary: r.summary }, r.schema_version);
  return {
    id: r.id,
    projectId: r.project_id,
    planRevision: { id: r.revision_id, number: r.revision_number },
    ruleSet: { id: r.rule_set_id, version: r.rule_set_version, jurisdiction: r.jurisdiction_slug, changelog: r.rule_set_changelog, status: r.rule_set_status },
    inputs: stored.inputs,
    facts: stored.facts as Record<string, unknown>,
    findings: stored.findings as Finding[],
    summary: stored.summary as EvaluationSummary,
    outcome: r.outcome,
    durationMs: r.duration_ms,
    createdBy: { id: r.created_by, name: r.created_by_name },
    createdAt: r.created_at,
  };
}

/** Stores a check whole (inputs with a plan in today's shape, facts, findings); it is never recomputed in place. */
export async function insertCheck(
  db: DB,
  input: {
    user: AppUser;
    projectId: string;
    planRevisionId: string;
    ruleSetId: string;
    inputs: StoredCheck['inputs'];
    evaluation: Evaluation;
    durationMs: number;
  },
): Promise<StoredCheck> {
  const id = await db.transaction().execute(async (trx) => {
    const row = await trx
      .insertInto('checks')
      .values({
        project_id: input.projectId,
        plan_revision_id: input.planRevisionId,
        rule_set_id: input.ruleSetId,
        inputs: JSON.stringify({ ...input.inputs, planSchemaVersion: PLAN_SCHEMA_VERSION }),
        facts: JSON.stringify(input.evaluation.facts),
        findings: JSON.stringify(input.evaluation.findings),
        summary: JSON.stringify(input.evaluation.summary),
        schema_version: CHECK_SCHEMA_VERSION,
        outcome: outcomeOf(input.evaluation.summary),
        duration_ms: Math.round(input.durationMs),
        created_by: input.user.id,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    await trx.updateTable('projects').set({ updated_at: new Date() }).where('id', '=', input.projectId).execute();
    await writeAudit(trx, {
      actorUserId: input.user.id,
      action: 'check.run',
      entityType: 'check',
      entityId: row.id,
      details: { projectId: input.projectId, ruleSetId: input.ruleSetId, summary: input.evaluation.summary },
    });
    return row.id;
  });
  return (await findCheckById(db, id))!;
}

/** One check by id, without an access check: for callers that already decided the reader may see it. */
export async function findCheckById(db: DB, id: string): Promise<StoredCheck | null> {
  const row = await checkQuery(db).where('c.id', '=', id).executeTakeFirst();
  return row ? toCheck(row) : null;
}

export async function listChecks(db: DB, user: AppUser, projectId: string): Promise<CheckListItem[]> {
  const project = await getProject(db, user, projectId);
  const rows = await checkQuery(db).where('c.project_id', '=', project.id).orderBy('c.created_at', 'desc').execute();
  return rows.map((r) => {
    const { inputs: _i, facts: _f, findings: _g, ...rest } = toCheck(r);
    return rest;
  });
}

/** One check, if the user may see its project. */
export async function findCheck(db: DB, user: AppUser, checkId: string): Promise<StoredCheck | null> {
  if (!isUuid(checkId)) return null;
  const check = await findCheckById(db, checkId);
  if (!check) return null;
  await getProject(db, user, check.projectId);
  return check;
}

/** The check run just before this one on the same project, for "what changed since". */
export async function previousCheck(db: DB, check: StoredCheck): Promise<StoredCheck | null> {
  const row = await checkQuery(db)
    .where('c.project_id', '=', check.projectId)
    .where('c.created_at', '<', check.createdAt)
    .orderBy('c.created_at', 'desc')
    .limit(1)
    .executeTakeFirst();
  return row ? toCheck(row) : null;
}

export type LatestCheckOfProject = {
  projectId: string;
  name: string;
  organization: string;
  latestCheck: { id: string; version: number; outcome: CheckOutcome; createdAt: Date; revisionNumber: number; findings: Finding[]; plan: unknown } | null;
};

/** Every open project of a jurisdiction with its latest check, if any (what the impact page compares). */
export async function listLatestChecksInJurisdiction(db: DB, jurisdictionId: string): Promise<LatestCheckOfProject[]> {
  const rows = await db
    .selectFrom('projects as p')
    .innerJoin('organizations as o', 'o.id', 'p.organization_id')
    .leftJoinLateral(
      (eb) =>
        eb
          .selectFrom('checks as c')
          .innerJoin('rule_sets as s', 's.id', 'c.rule_set_id')
          .innerJoin('plan_revisions as r', 'r.id', 'c.plan_revision_id')
          .select(['c.id as check_id', 'c.outcome', 'c.inputs', 'c.facts', 'c.findings', 'c.summary', 'c.schema_version', 'c.created_at as checked_at', 's.version', 'r.number as revision_number'])
          .whereRef('c.project_id', '=', 'p.id')
          .orderBy('c.created_at', 'desc')
          .limit(1)
          .as('lc'),
      (join) => join.onTrue(),
    )
    .select([
      'p.id', 'p.name', 'o.name as organization', 'lc.check_id', 'lc.outcome', 'lc.inputs', 'lc.facts', 'lc.findings', 'lc.summary', 'lc.schema_version',
      'lc.checked_at', 'lc.version', 'lc.revision_number',
    ])
    .where('p.jurisdiction_id', '=', jurisdictionId)
    .where('p.archived_at', 'is', null)
    .orderBy('p.name')
    .execute();
  return rows.map((r) => {
    if (!r.check_id) return { projectId: r.id, name: r.name, organization: r.organization, latestCheck: null };
    const stored = readStoredCheck({ inputs: r.inputs, facts: r.facts, findings: r.findings, summary: r.summary }, r.schema_version!);
    return {
      projectId: r.id,
      name: r.name,
      organization: r.organization,
      latestCheck: {
        id: r.check_id,
        version: r.version!,
        outcome: r.outcome!,
        createdAt: r.checked_at!,
        revisionNumber: r.revision_number!,
        findings: stored.findings as Finding[],
        plan: stored.inputs.plan,
      },
    };
  });
}
