'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useRef, useState } from 'react';
import { BusyButton } from '@/components/busy-button';
import { isFinished, pollRun, RunProgress, type RunStatus } from '@/components/admin/run-progress';
import { fetchJson } from '@/lib/platform/client/fetch-json';

/**
 * The impact run behind the page: starts one when the page has none for the published version, shows its
 * progress while the job works, and reloads the page's result when it is done. "Run again" starts a new run
 * (projects re-checked since the last one change the answer); the old runs stay on record.
 */
export function ImpactRunPanel({ slug, version, initial, autoStart, finishedText }: {
  slug: string;
  version: number;
  initial: RunStatus | null;
  autoStart: boolean;
  finishedText: string | null;
}) {
  const router = useRouter();
  const [run, setRun] = useState<RunStatus | null>(initial);
  const [error, setError] = useState<string | null>(null);
  const gone = useRef(false);

  async function follow(started: RunStatus, cancelled: () => boolean) {
    const finished = await pollRun(`/api/jurisdictions/${slug}/impact-runs/${started.id}`, setRun, cancelled);
    if (finished?.state === 'done') router.refresh();
  }

  async function start(cancelled: () => boolean = () => gone.current) {
    setError(null);
    try {
      const started = await fetchJson<RunStatus>(`/api/jurisdictions/${slug}/impact-runs`, { method: 'POST', json: { version } });
      if (cancelled()) return;
      setRun(started);
      await follow(started, cancelled);
    } catch (err) {
      if (!cancelled()) setError((err as Error).message);
    }
  }

  useEffect(() => {
    let cancelled = false;
    gone.current = false;
    // A second start (React's development double effect, two tabs) joins the run already working.
    const kickoff = setTimeout(() => {
      if (initial && !isFinished(initial)) follow(initial, () => cancelled).catch((err: Error) => setError(err.message));
      else if (autoStart) void start(() => cancelled);
    }, 0);
    return () => {
      clearTimeout(kickoff);
      cancelled = true;
      gone.current = true;
    };
    // Once per run shown: the page remounts this panel (its key) when the server has a newer run.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  const working = run && !isFinished(run);
  return (
    <section className="card mb-4 p-4" aria-labelledby="impact-run-h" data-testid="impact-run">
      <h2 id="impact-run-h" className="font-bold">Impact run</h2>
      {working ? (
        <RunProgress run={run} label={`Re-evaluating each open project’s latest check against version ${version}`} />
      ) : run?.state === 'failed' ? (
        <p role="alert" className="mt-1 text-sm text-status-fail" data-testid="impact-run-failed">The impact run did not finish: {run.error ?? 'unknown error'}</p>
      ) : run?.state === 'done' && finishedText ? (
        <p className="mt-1 text-sm text-ink-soft" data-testid="impact-run-finished">Result of the run finished {finishedText}, over {run.total} open project{run.total === 1 ? '' : 's'}. Projects re-checked since then are not in it; run it again for today’s answer.</p>
      ) : !run ? (
        <p className="mt-1 text-sm text-ink-soft">Starting the impact run…</p>
      ) : null}
      {error && <p role="alert" className="mt-1 text-sm text-status-fail">{error}</p>}
      {!working && (run || error) && (
        <BusyButton className="btn-secondary mt-3" onClick={() => start()} busyText="Starting…">Run again</BusyButton>
      )}
    </section>
  );
}
