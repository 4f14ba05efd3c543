'use client';

import { useId } from 'react';
import { fetchJson } from '@/lib/platform/client/fetch-json';
import { runProgressText, type RuleSetRunStatus } from '@/lib/domain/rule-sets/runs';

export type RunStatus = RuleSetRunStatus;

export const isFinished = (run: Pick<RunStatus, 'state'>) => run.state === 'done' || run.state === 'failed';

/**
 * A run's progress: a progress bar with its value for assistive technology ("120 of 400 projects"), indeterminate
 * until the worker has counted what it evaluates.
 */
export function RunProgress({ run, label }: { run: RunStatus; label: string }) {
  const labelId = useId();
  const text = runProgressText(run);
  const known = run.total !== null && run.state !== 'queued';
  const percent = known && run.total ? Math.round((run.done / run.total) * 100) : 0;
  return (
    <div className="mt-3" data-testid="run-progress" data-state={run.state}>
      <p id={labelId} className="text-sm font-semibold">{label}</p>
      <div
        role="progressbar"
        aria-labelledby={labelId}
        aria-valuemin={0}
        aria-valuemax={known ? run.total! : undefined}
        aria-valuenow={known ? run.done : undefined}
        aria-valuetext={text}
        className="mt-1 h-3 w-full max-w-md overflow-hidden rounded-full border border-rule bg-paper-deep"
      >
        <div className={`h-full bg-brass ${known ? '' : 'animate-pulse'}`} style={{ width: known ? `${percent}%` : '100%', opacity: known ? 1 : 0.35 }} />
      </div>
      <p className="mt-1 text-sm text-ink-soft" aria-live="polite" data-testid="run-progress-text">{text}</p>
    </div>
  );
}

/**
 * Asks for the run until it is done or failed, handing each answer to `onUpdate`; a few failed requests in a row
 * (the server restarting) are waited out. Returns null when `cancelled()` says the page went away.
 */
export async function pollRun<T extends RunStatus>(url: string, onUpdate: (run: T) => void, cancelled: () => boolean, intervalMs = 800): Promise<T | null> {
  let failures = 0;
  for (;;) {
    if (cancelled()) return null;
    try {
      const run = await fetchJson<T>(url);
      failures = 0;
      if (cancelled()) return null;
      onUpdate(run);
      if (isFinished(run)) return run;
    } catch (err) {
      if (++failures >= 5) throw err;
    }
    await new Promise((resolve) => setTimeout(resolve, intervalMs));
  }
}
