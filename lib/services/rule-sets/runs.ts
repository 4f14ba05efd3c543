import 'server-only';
import type { DB } from '@/db';
import { findPublishedRuleSet, findRuleSetById } from '@/db/rule-sets';
import {
  claimRuleSetRun,
  failRuleSetRun,
  failStalledRuleSetRun,
  findActiveRuleSetRun,
  findLatestRuleSetRun,
  findRuleSetRun,
  finishRuleSetRun,
  insertRuleSetRun,
  listStalledRuleSetRuns,
  recordRuleSetRunProgress,
  type StallLimits,
} from '@/db/rule-set-runs';
import type { Jurisdiction } from '@/db/jurisdictions';
import { ConflictError, NotFoundError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';
import type { RuleSetRun } from '@/lib/domain/rule-sets/runs';
import { enqueue, type JobQueue, positiveIntSetting } from '@/lib/platform/jobs/boss';
import { log } from '@/lib/platform/log';
import { requeueOrEnd } from '@/lib/services/jobs/stalled-work';
import { auditDryRun, computeImpact, evaluateDryRun, type DryRunResult, type ImpactResult } from '@/lib/services/rule-sets/comparisons';

/*
 * Impact and dry runs over every project of a jurisdiction, done by a job: the request records the run and answers
 * at once (202), the page polls its progress. The worker claims the run by a conditional UPDATE with a token of its
 * own, writes progress and the result only under that token, and starts counting afresh on each claim, so a retried
 * or duplicated job never counts twice or stores a second result. The evaluation is the same code the synchronous
 * routes call (evaluateDryRun, computeImpact).
 */


export function ruleSetRunConfig() {
  return {
    /** Subjects evaluated between two progress writes. */
    batchSize: positiveIntSetting(process.env.NOOKPASS_RUN_BATCH_SIZE, 25),
    /** A claim whose progress has not moved for this long belongs to a worker that died. */
    staleClaimSeconds: positiveIntSetting(process.env.NOOKPASS_RUN_STALE_SECONDS, 120),
    /** A run queued this long with no worker taking it has lost its job (runs wait their turn, one per server). */
    queuedGraceSeconds: positiveIntSetting(process.env.NOOKPASS_RUN_QUEUED_GRACE_SECONDS, 3600),
    pollingIntervalSeconds: Number(process.env.NOOKPASS_JOB_POLL_SECONDS ?? 1) || 1,
  };
}

export const RULE_SET_RUN_QUEUE: JobQueue = { name: 'rule-set-run', retryLimit: 2, retryDelaySeconds: 10, expireInSeconds: 3600 };

/** The pass that finds runs whose worker died; pg-boss sends it once a minute for all servers together. */
export const RULE_SET_RUN_SWEEP_QUEUE: JobQueue = { name: 'rule-set-run-sweep', retryLimit: 0, retryDelaySeconds: 30, expireInSeconds: 300 };

export const STALLED_RUN_MESSAGE = 'The run stopped: the server working on it stopped answering. Start it again.';

/**
 * A run with no sign of life (running with no progress for the stale time, or queued an hour with nobody taking
 * it) goes back in the queue, where the next worker claims it and starts counting afresh; one whose attempts are
 * spent is marked failed, so the page stops showing it as working. Without this pass a run cut off by a server
 * stopping would wait for its job to expire (an hour) before pg-boss tried it again.
 */
export async function requeueStalledRuns(db: DB): Promise<{ queued: number; failed: number }> {
  const cfg = ruleSetRunConfig();
  const limits: StallLimits = { queuedSeconds: cfg.queuedGraceSeconds, runningSeconds: cfg.staleClaimSeconds };
  return requeueOrEnd(await listStalledRuleSetRuns(db, limits, 50), {
    spent: (run) => run.attempts >= RULE_SET_RUN_QUEUE.retryLimit + 1,
    end: (run) => failStalledRuleSetRun(db, run.id, limits, STALLED_RUN_MESSAGE),
    queue: RULE_SET_RUN_QUEUE,
    job: (run) => ({ runId: run.id }),
    what: 'stalled rule set runs',
  });
}

export type DryRun = RuleSetRun<DryRunResult>;
export type ImpactRun = RuleSetRun<ImpactResult>;

/** Queues the job of a recorded run; a run that cannot be queued is marked failed, so nobody waits for it. */
async function dispatchRun(run: RuleSetRun): Promise<RuleSetRun> {
  try {
    await enqueue(RULE_SET_RUN_QUEUE, { runId: run.id });
    return run;
  } catch (err) {
    log.error({ err, runId: run.id }, 'rule set run recorded but not queued');
    throw err;
  }
}

async function recordAndDispatch(db: DB, run: Parameters<typeof insertRuleSetRun>[1]): Promise<RuleSetRun> {
  const recorded = await insertRuleSetRun(db, run);
  try {
    return await dispatchRun(recorded);
  } catch (err) {
    await failRuleSetRun(db, recorded.id, null, 'The run could not be queued; start it again.', true);
    throw err;
  }
}

/** Starts a dry run of a draft (or joins one already working on the same revision). */
export async function startDryRun(db: DB, actor: AppUser, ruleSetId: string, input: { revision?: number }): Promise<{ run: DryRun; joined: boolean }> {
  const draft = await findRuleSetById(db, ruleSetId);
  if (!draft) throw new NotFoundError('No such rule set version.');
  if (input.revision !== undefined && input.revision !== draft.revision) {
    throw new ConflictError(`The draft is at revision ${draft.revision} now, not ${input.revision}; reload it before the dry run.`);
  }
  const active = await findActiveRuleSetRun(db, 'dry-run', draft.id, draft.revision, ruleSetRunConfig().staleClaimSeconds);
  if (active) return { run: active as DryRun, joined: true };
  const run = await recordAndDispatch(db, {
    kind: 'dry-run',
    jurisdictionId: draft.jurisdictionId,
    ruleSetId: draft.id,
    ruleSetVersion: draft.version,
    draftRevision: draft.revision,
    requestedBy: actor.id,
  });
  return { run: run as DryRun, joined: false };
}

/** Starts an impact run of the jurisdiction's published version (or joins one already working on it). */
export async function startImpactRun(db: DB, actor: AppUser, jurisdiction: Jurisdiction, input: { version?: number }): Promise<{ run: ImpactRun; joined: boolean }> {
  const published = await findPublishedRuleSet(db, jurisdiction.id);
  if (!published) throw new ConflictError(`${jurisdiction.name} has no published version yet; there is no impact to measure.`);
  if (input.version !== undefined && input.version !== published.version) {
    throw new ConflictError(`Version ${published.version} is published now, not ${input.version}; reload the page.`);
  }
  const active = await findActiveRuleSetRun(db, 'impact', published.id, null, ruleSetRunConfig().staleClaimSeconds);
  if (active) return { run: active as ImpactRun, joined: true };
  const run = await recordAndDispatch(db, {
    kind: 'impact',
    jurisdictionId: jurisdiction.id,
    ruleSetId: published.id,
    ruleSetVersion: published.version,
    draftRevision: null,
    requestedBy: actor.id,
  });
  return { run: run as ImpactRun, joined: false };
}

/** One dry run of this rule set version; another version's run is "not found". */
export async function getDryRun(db: DB, ruleSetId: string, runId: string): Promise<DryRun> {
  const run = await findRuleSetRun(db, runId);
  if (!run || run.kind !== 'dry-run' || run.ruleSetId !== ruleSetId) throw new NotFoundError('No such dry run of this version.');
  return run as DryRun;
}

/** One impact run of this jurisdiction; another jurisdiction's run is "not found". */
export async function getImpactRun(db: DB, jurisdiction: Pick<Jurisdiction, 'id'>, runId: string): Promise<ImpactRun> {
  const run = await findRuleSetRun(db, runId);
  if (!run || run.kind !== 'impact' || run.jurisdictionId !== jurisdiction.id) throw new NotFoundError('No such impact run in this jurisdiction.');
  return reviveImpact(run as ImpactRun);
}

export async function findLatestDryRun(db: DB, ruleSetId: string): Promise<DryRun | null> {
  return (await findLatestRuleSetRun(db, 'dry-run', ruleSetId)) as DryRun | null;
}

export async function findLatestImpactRun(db: DB, publishedId: string): Promise<ImpactRun | null> {
  const run = (await findLatestRuleSetRun(db, 'impact', publishedId)) as ImpactRun | null;
  return run && reviveImpact(run);
}

/** A stored result holds dates as JSON text; pages read them as dates again. */
function reviveImpact(run: ImpactRun): ImpactRun {
  if (!run.result) return run;
  const items = run.result.items.map((i) => (i.latestCheck ? { ...i, latestCheck: { ...i.latestCheck, createdAt: new Date(i.latestCheck.createdAt) } } : i));
  return { ...run, result: { ...run.result, items } };
}

export class RunAttemptFailed extends Error {}

/**
 * The job: claims the run, evaluates in batches with progress, stores the result once. Returns what happened;
 * throws RunAttemptFailed when the job should be retried.
 */
export async function executeRuleSetRun(db: DB, runId: string, job: { lastTry: boolean }): Promise<'done' | 'not-claimed' | 'claim-lost' | 'failed'> {
  const cfg = ruleSetRunConfig();
  const claim = await claimRuleSetRun(db, runId, cfg.staleClaimSeconds);
  if (!claim) return 'not-claimed';
  const { run, token } = claim;
  const progress = {
    batchSize: cfg.batchSize,
    onBatch: async (done: number, total: number) => {
      if (!(await recordRuleSetRunProgress(db, run.id, token, done, total))) throw new ClaimLost();
    },
  };
  try {
    if (run.kind === 'dry-run') {
      if (!run.ruleSetId) throw new PermanentRunError('The draft was discarded before its dry run started.');
      const result = await evaluateDryRun(db, run.ruleSetId, progress);
      const finished = await db.transaction().execute(async (trx) => {
        const ok = await finishRuleSetRun(trx, run.id, token, result, result.subjects.length);
        if (ok && run.requestedBy) await auditDryRun(trx, run.requestedBy, run.jurisdictionId, result);
        return ok;
      });
      return finished ? 'done' : 'claim-lost';
    }
    const published = await findPublishedRuleSet(db, run.jurisdictionId);
    if (!published || published.id !== run.ruleSetId) {
      throw new PermanentRunError(`Version ${run.ruleSetVersion} is no longer the published version; start a new impact run.`);
    }
    const result = await computeImpact(db, run.jurisdictionId, progress);
    return (await finishRuleSetRun(db, run.id, token, result, result.items.length)) ? 'done' : 'claim-lost';
  } catch (err) {
    if (err instanceof ClaimLost) return 'claim-lost';
    if (err instanceof NotFoundError) err = new PermanentRunError('The draft was discarded before its dry run finished.');
    const permanent = err instanceof PermanentRunError;
    const message = err instanceof Error ? err.message : String(err);
    await failRuleSetRun(db, run.id, token, permanent ? message : `The run stopped: ${message}`, permanent || job.lastTry);
    log.warn({ err, runId: run.id, kind: run.kind }, 'rule set run attempt failed');
    if (!permanent && !job.lastTry) throw new RunAttemptFailed(message);
    return 'failed';
  }
}

class ClaimLost extends Error {}
class PermanentRunError extends Error {}
