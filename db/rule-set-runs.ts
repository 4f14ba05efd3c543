import { sql, type ExpressionBuilder, type Selectable } from 'kysely';
import type { DB } from '@/db/index';
import type { Database, RuleSetRunsTable } from '@/db/types';
import { isUuid } from '@/lib/domain/ids';
import type { RuleSetRun, RuleSetRunKind } from '@/lib/domain/rule-sets/runs';

function toRun(r: Selectable<RuleSetRunsTable>): RuleSetRun {
  return {
    id: r.id,
    kind: r.kind,
    jurisdictionId: r.jurisdiction_id,
    ruleSetId: r.rule_set_id,
    ruleSetVersion: r.rule_set_version,
    draftRevision: r.draft_revision,
    state: r.state,
    done: r.done_count,
    total: r.total_count,
    result: r.result ?? null,
    error: r.error,
    attempts: r.attempts,
    requestedBy: r.requested_by,
    createdAt: r.created_at,
    startedAt: r.started_at,
    finishedAt: r.finished_at,
  };
}

export type NewRuleSetRun = {
  kind: RuleSetRunKind;
  jurisdictionId: string;
  ruleSetId: string;
  ruleSetVersion: number;
  draftRevision: number | null;
  requestedBy: string;
};

export async function insertRuleSetRun(db: DB, run: NewRuleSetRun): Promise<RuleSetRun> {
  const row = await db
    .insertInto('rule_set_runs')
    .values({
      kind: run.kind,
      jurisdiction_id: run.jurisdictionId,
      rule_set_id: run.ruleSetId,
      rule_set_version: run.ruleSetVersion,
      draft_revision: run.draftRevision,
      requested_by: run.requestedBy,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
  return toRun(row);
}

export async function findRuleSetRun(db: DB, id: string): Promise<RuleSetRun | null> {
  if (!isUuid(id)) return null;
  const row = await db.selectFrom('rule_set_runs').selectAll().where('id', '=', id).executeTakeFirst();
  return row ? toRun(row) : null;
}

/** The newest run of a kind for one rule set version (impact: a published version; dry run: a draft). */
export async function findLatestRuleSetRun(db: DB, kind: RuleSetRunKind, ruleSetId: string): Promise<RuleSetRun | null> {
  const row = await db
    .selectFrom('rule_set_runs')
    .selectAll()
    .where('kind', '=', kind)
    .where('rule_set_id', '=', ruleSetId)
    .orderBy('created_at', 'desc')
    .orderBy('id', 'desc')
    .limit(1)
    .executeTakeFirst();
  return row ? toRun(row) : null;
}

/**
 * A run of the same kind over the same version (and draft revision) still waiting or working, whose worker has
 * shown signs of life within `freshSeconds`: asking again joins it instead of evaluating everything twice.
 */
export async function findActiveRuleSetRun(db: DB, kind: RuleSetRunKind, ruleSetId: string, draftRevision: number | null, freshSeconds: number): Promise<RuleSetRun | null> {
  let query = db
    .selectFrom('rule_set_runs')
    .selectAll()
    .where('kind', '=', kind)
    .where('rule_set_id', '=', ruleSetId)
    .where('state', 'in', ['queued', 'running'])
    .where(sql<boolean>`coalesce(claimed_at, created_at) > now() - make_interval(secs => ${freshSeconds})`);
  query = draftRevision === null ? query.where('draft_revision', 'is', null) : query.where('draft_revision', '=', draftRevision);
  const row = await query.orderBy('created_at', 'desc').limit(1).executeTakeFirst();
  return row ? toRun(row) : null;
}

export type RunClaim = { run: RuleSetRun; token: string };

/**
 * Takes the run for one worker. Only one caller wins: the run must be queued, or running under a claim so old that
 * its worker must have died (progress renews the claim). The winner starts counting from zero under a new token;
 * anyone else gets null and does nothing.
 */
export async function claimRuleSetRun(db: DB, id: string, staleClaimSeconds: number): Promise<RunClaim | null> {
  if (!isUuid(id)) return null;
  const row = await db
    .updateTable('rule_set_runs')
    .set({
      state: 'running',
      claim_token: sql<string>`gen_random_uuid()`,
      claimed_at: sql<Date>`now()`,
      started_at: sql<Date>`coalesce(started_at, now())`,
      attempts: sql<number>`attempts + 1`,
      done_count: 0,
      total_count: null,
      error: null,
    })
    .where('id', '=', id)
    .where((eb) =>
      eb.or([
        eb('state', '=', 'queued'),
        eb.and([eb('state', '=', 'running'), eb('claimed_at', '<', sql<Date>`now() - make_interval(secs => ${staleClaimSeconds})`)]),
      ]),
    )
    .returningAll()
    .executeTakeFirst();
  return row ? { run: toRun(row), token: row.claim_token! } : null;
}

/** Progress under a claim; false when the claim was lost (the worker then stops). */
export async function recordRuleSetRunProgress(db: DB, id: string, token: string, done: number, total: number): Promise<boolean> {
  const result = await db
    .updateTable('rule_set_runs')
    .set({ done_count: done, total_count: total, claimed_at: sql<Date>`now()` })
    .where('id', '=', id)
    .where('state', '=', 'running')
    .where('claim_token', '=', token)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) > 0;
}

/** Stores the result once, under the claim; false when another worker holds the run or it is finished. */
export async function finishRuleSetRun(db: DB, id: string, token: string, result: unknown, total: number): Promise<boolean> {
  const updated = await db
    .updateTable('rule_set_runs')
    .set({ state: 'done', result: JSON.stringify(result), done_count: total, total_count: total, finished_at: sql<Date>`now()`, claim_token: null })
    .where('id', '=', id)
    .where('state', '=', 'running')
    .where('claim_token', '=', token)
    .executeTakeFirst();
  return Number(updated.numUpdatedRows) > 0;
}

/** How long a run may wait for a worker, and go without progress while running, before it counts as stalled. */
export type StallLimits = { queuedSeconds: number; runningSeconds: number };

const stalledWhere = (limits: StallLimits) => (eb: ExpressionBuilder<Database, 'rule_set_runs'>) =>
  eb.or([
    eb.and([eb('state', '=', 'queued'), eb(sql<Date>`coalesce(claimed_at, created_at)`, '<', sql<Date>`now() - make_interval(secs => ${limits.queuedSeconds})`)]),
    eb.and([eb('state', '=', 'running'), eb('claimed_at', '<', sql<Date>`now() - make_interval(secs => ${limits.runningSeconds})`)]),
  ]);

/** Runs that should be in the works but show no sign of it (their worker died and its job is gone), oldest first. */
export async function listStalledRuleSetRuns(db: DB, limits: StallLimits, limit: number): Promise<{ id: string; attempts: number; state: string }[]> {
  return db.selectFrom('rule_set_runs').select(['id', 'attempts', 'state']).where(stalledWhere(limits)).orderBy('created_at').limit(limit).execute();
}

/** Ends a stalled run after its last attempt; false if a worker took it or it finished meanwhile. */
export async function failStalledRuleSetRun(db: DB, id: string, limits: StallLimits, error: string): Promise<boolean> {
  const updated = await db
    .updateTable('rule_set_runs')
    .set({ state: 'failed', error, finished_at: sql<Date>`now()`, claim_token: null })
    .where('id', '=', id)
    .where(stalledWhere(limits))
    .executeTakeFirst();
  return Number(updated.numUpdatedRows) > 0;
}

/** A failed attempt: back to queued for the job's retry, or failed for good after the last one. */
export async function failRuleSetRun(db: DB, id: string, token: string | null, error: string, final: boolean): Promise<boolean> {
  let query = db
    .updateTable('rule_set_runs')
    .set(final ? { state: 'failed', error, finished_at: sql<Date>`now()`, claim_token: null } : { state: 'queued', error, claim_token: null, claimed_at: null })
    .where('id', '=', id)
    .where('state', 'in', ['queued', 'running']);
  query = token === null ? query.where('claim_token', 'is', null) : query.where('claim_token', '=', token);
  const updated = await query.executeTakeFirst();
  return Number(updated.numUpdatedRows) > 0;
}
