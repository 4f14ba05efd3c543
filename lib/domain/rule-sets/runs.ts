/** Impact and dry runs done by a job: what the pages and the API say about one. */

export const RULE_SET_RUN_KINDS = ['impact', 'dry-run'] as const;
export type RuleSetRunKind = (typeof RULE_SET_RUN_KINDS)[number];

export const RULE_SET_RUN_STATES = ['queued', 'running', 'done', 'failed'] as const;
export type RuleSetRunState = (typeof RULE_SET_RUN_STATES)[number];

export type RuleSetRun<R = unknown> = {
  id: string;
  kind: RuleSetRunKind;
  jurisdictionId: string;
  /** The published version (impact) or the draft (dry run); null once a draft is discarded. */
  ruleSetId: string | null;
  ruleSetVersion: number;
  /** The draft's revision when the run was asked for (dry runs only). */
  draftRevision: number | null;
  state: RuleSetRunState;
  done: number;
  /** Known once the worker has listed what it evaluates. */
  total: number | null;
  result: R | null;
  error: string | null;
  attempts: number;
  requestedBy: string | null;
  createdAt: Date;
  startedAt: Date | null;
  finishedAt: Date | null;
};

export const isActiveRun = (run: Pick<RuleSetRun, 'state'>) => run.state === 'queued' || run.state === 'running';

/** "120 of 400 projects": the progress a person reads while a run works. */
export function runProgressText(run: Pick<RuleSetRun, 'state' | 'done' | 'total' | 'kind'>): string {
  const noun = run.kind === 'impact' ? 'projects' : 'plans';
  if (run.state === 'queued' || run.total === null) return 'Waiting for a worker…';
  return `${run.done} of ${run.total} ${noun}`;
}

/** What a page needs of a run to show where it stands (the result travels separately). */
export type RuleSetRunStatus = Pick<RuleSetRun, 'id' | 'kind' | 'state' | 'done' | 'total' | 'error' | 'draftRevision'> & { finishedAt: Date | string | null };

export const runStatusOf = (run: RuleSetRun): RuleSetRunStatus => ({
  id: run.id,
  kind: run.kind,
  state: run.state,
  done: run.done,
  total: run.total,
  error: run.error,
  draftRevision: run.draftRevision,
  finishedAt: run.finishedAt,
});
