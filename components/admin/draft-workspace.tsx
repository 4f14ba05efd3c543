'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useRef, useState } from 'react';
import useSWR from 'swr';
import type { RuleSetWithRules } from '@/db/rule-sets';
import type { SubjectComparison } from '@/lib/domain/rule-sets/dry-run';
import type { RuleFormValues } from '@/lib/domain/rule-sets/rule-input';
import { ApiError, fetchJson, swrFetcher } from '@/lib/platform/client/fetch-json';
import type { RuleSetParameters } from '@/lib/domain/params';
import type { StoredRule } from '@/lib/domain/rule-format';
import { DryRunResults } from '@/components/admin/dry-run-results';
import { ParametersForm } from '@/components/admin/parameters-form';
import { FactReference, RuleTable } from '@/components/admin/rule-editor';
import { CitationChecks, type CitationList } from '@/components/admin/citation-checks';
import { BusyButton } from '@/components/busy-button';
import type { ComparedWith } from '@/lib/services/rule-sets/comparisons';
import { isFinished, pollRun, RunProgress, type RunStatus } from '@/components/admin/run-progress';
import { formatDateTime } from '@/lib/domain/dates/format';

type DraftSet = Omit<RuleSetWithRules, 'createdAt' | 'updatedAt' | 'publishedAt' | 'retiredAt'> & { updatedAt: string | Date };
type DryRun = { published: { version: number } | null; comparedWith?: ComparedWith; draft: { id: string; version: number; revision: number }; subjects: SubjectComparison[]; totals: { subjects: number; changed: number; newlyFailing: number; newlyPassing: number }; adminNotes?: Array<{ ruleKey: string; title: string; note: string }> };

/** Where a write started: its conflict is shown next to that button. */
type Source = 'parameters' | 'rules' | 'note' | 'publish' | 'discard';

function Conflict({ message, onReload }: { message: string; onReload: () => void }) {
  return (
    <div role="alert" className="card mt-3 border-status-fail p-4" data-testid="conflict">
      <p className="font-semibold text-status-fail">Not saved: someone else changed this draft.</p>
      <p className="mt-1 text-sm">{message}</p>
      <button type="button" className="btn-secondary mt-3" onClick={onReload}>Reload the draft</button>
    </div>
  );
}

/**
 * The draft editor: parameters, rules, dry run and publish. Each save answers with the draft's new
 * revision, which the next write sends, and writes go one after another, so one admin's own saves
 * never conflict with each other. A 409 means another admin saved first; the page keeps what was
 * typed, shows the conflict beside the button that met it and offers to reload their version.
 */
/** The draft's latest dry run as the server found it: where it stands, and its result once done. */
export type LatestDryRun = { run: RunStatus; result: unknown } | null;

export function DraftWorkspace({ initial, slug, timeZone, latestDryRun }: { initial: DraftSet; slug: string; timeZone: string; latestDryRun: LatestDryRun }) {
  const router = useRouter();
  const url = `/api/rule-sets/${initial.id}`;
  // The revision must stay the one the form's values came from: a silent refetch on mount would
  // pick up another admin's newer revision and let a stale form overwrite it.
  const { data, mutate } = useSWR<DraftSet>(url, swrFetcher, {
    fallbackData: initial,
    revalidateOnMount: false,
    revalidateIfStale: false,
    revalidateOnFocus: false,
    revalidateOnReconnect: false,
  });
  const set = data ?? initial;
  const [conflict, setConflictState] = useState<{ source: Source; message: string } | null>(null);
  // The revision the next write claims: the answer of the last save, not the render's copy, so a
  // write queued behind a save (Save note, then Publish) sends the revision that save produced.
  const revision = useRef(initial.revision);
  const queue = useRef<Promise<unknown>>(Promise.resolve());
  const [confirming, setConfirming] = useState(false);
  const [reloads, setReloads] = useState(0);
  const shownRun = latestDryRun?.run.state === 'done' ? latestDryRun : null;
  const [dryRun, setDryRun] = useState<DryRun | null>((shownRun?.result as DryRun | undefined) ?? null);
  const working = latestDryRun && !isFinished(latestDryRun.run) ? latestDryRun.run : null;
  const [dryRunState, setDryRunState] = useState<'idle' | 'running' | 'stale'>(
    working ? 'running' : shownRun && (shownRun.result as DryRun).draft.revision !== initial.revision ? 'stale' : 'idle',
  );
  // The job's progress while a dry run works, and when the one shown finished.
  const [dryRunProgress, setDryRunProgress] = useState<RunStatus | null>(working);
  const [dryRunFinishedAt, setDryRunFinishedAt] = useState<string | Date | null>(shownRun?.run.finishedAt ?? null);
  const gone = useRef(false);
  const [changelog, setChangelog] = useState(initial.changelog);
  const [publishError, setPublishError] = useState<string | null>(null);
  const [publishing, setPublishing] = useState(false);
  const [confirmUnchecked, setConfirmUnchecked] = useState<string | null>(null);
  const citations = useSWR<CitationList>(`${url}/citations`, swrFetcher, { revalidateOnFocus: false });

  const setConflict = (source: Source, message: string | null) => setConflictState(message === null ? null : { source, message });
  useEffect(() => {
    if (data) revision.current = Math.max(revision.current, data.revision);
  }, [data]);

  /** Runs writes one at a time, each built with the revision current when its turn comes. */
  function inTurn<T>(task: () => Promise<T>): Promise<T> {
    const run = queue.current.then(task, task);
    queue.current = run.catch(() => undefined);
    return run;
  }

  /** Every save goes through here: on success the new revision is kept, on 409 the conflict is shown beside its source. */
  function write(source: Source, request: (revision: number) => { path: string; method: string; json?: unknown }) {
    return inTurn(async () => {
      const { path, ...init } = request(revision.current);
      try {
        const next = await fetchJson<DraftSet>(path, init);
        revision.current = next.revision;
        setConflictState(null);
        await mutate(next, { revalidate: false });
        // The changelog note changes no finding.
        // A dry run still working decides for itself when it ends (by the revision it read).
        if (dryRun && source !== 'note') setDryRunState((state) => (state === 'running' ? state : 'stale'));
        void citations.mutate();
        return next;
      } catch (err) {
        if (err instanceof ApiError && err.status === 409) setConflict(source, err.message);
        throw err;
      }
    });
  }

  async function reload() {
    const fresh = await mutate();
    if (fresh) revision.current = fresh.revision;
    setConflictState(null);
    setReloads((n) => n + 1);
  }

  const saveParameters = async (parameters: RuleSetParameters) => {
    await write('parameters', (r) => ({ path: url, method: 'PATCH', json: { revision: r, parameters } }));
  };
  const saveRule = async (key: string, rule: RuleFormValues | StoredRule) => {
    await write('rules', (r) => ({ path: `${url}/rules/${encodeURIComponent(key)}`, method: 'PUT', json: { revision: r, rule } }));
  };
  const addRule = async (rule: RuleFormValues) => {
    await write('rules', (r) => ({ path: `${url}/rules`, method: 'POST', json: { revision: r, rule } }));
  };
  const deleteRule = async (key: string) => {
    await write('rules', (r) => ({ path: `${url}/rules/${encodeURIComponent(key)}?revision=${r}`, method: 'DELETE' }));
  };
  const saveNote = async () => {
    setPublishError(null);
    try {
      await write('note', (r) => ({ path: url, method: 'PATCH', json: { revision: r, changelog } }));
    } catch (err) {
      if (!(err instanceof ApiError && err.status === 409)) setPublishError((err as Error).message);
    }
  };

  /**
   * The dry run is a job: it is queued after the saves under way (so it evaluates what was just saved), its
   * progress is polled, and its result is for the revision the job read, which may be older than the draft by
   * the time it is done.
   */
  async function followDryRun(started: RunStatus, cancelled: () => boolean): Promise<DryRun | null> {
    const finished = await pollRun<RunStatus & { result: DryRun | null }>(`${url}/dry-runs/${started.id}`, setDryRunProgress, cancelled);
    if (!finished) return null;
    setDryRunProgress(null);
    if (finished.state === 'failed' || !finished.result) throw new Error(`The dry run did not finish: ${finished.error ?? 'unknown error'}`);
    setDryRun(finished.result);
    setDryRunFinishedAt(finished.finishedAt);
    setDryRunState(finished.result.draft.revision === revision.current ? 'idle' : 'stale');
    return finished.result;
  }

  async function runDryRun(cancelled: () => boolean = () => gone.current): Promise<DryRun | null> {
    setDryRunState('running');
    try {
      const started = await inTurn(() => fetchJson<RunStatus>(`${url}/dry-runs`, { method: 'POST', json: {} }));
      if (cancelled()) return null;
      setDryRunProgress(started);
      return await followDryRun(started, cancelled);
    } catch (err) {
      if (cancelled()) return null;
      setPublishError((err as Error).message);
      setDryRunProgress(null);
      setDryRunState(dryRun ? 'stale' : 'idle');
      return null;
    }
  }

  // The latest dry run is shown when it is for this revision; one still working is followed; otherwise a new one starts.
  useEffect(() => {
    let cancelled = false;
    gone.current = false;
    const latest = latestDryRun?.run;
    const matches = latest && latest.draftRevision === initial.revision && latest.state !== 'failed';
    const kickoff = setTimeout(() => {
      if (latest && !isFinished(latest)) {
        followDryRun(latest, () => cancelled).catch((err: Error) => {
          if (!cancelled) {
            setPublishError(err.message);
            setDryRunState('idle');
          }
        });
      } else if (!matches) {
        void runDryRun(() => cancelled);
      }
    }, 0);
    return () => {
      clearTimeout(kickoff);
      cancelled = true;
      gone.current = true;
    };
    // Once per page load: later runs are started by the buttons.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  /** Opens the confirmation: the changelog and the projects the dry run finds, run afresh when stale. */
  async function askToPublish() {
    setPublishError(null);
    if (!changelog.trim()) {
      setPublishError('Write the changelog note installers will see before publishing.');
      return;
    }
    setConfirming(true);
    if (!dryRun || dryRunState === 'stale') await runDryRun();
  }

  async function publish(confirm = false) {
    setPublishError(null);
    setPublishing(true);
    try {
      await inTurn(() => fetchJson(`${url}/publish`, { method: 'POST', json: { revision: revision.current, changelog, ...(confirm ? { confirm: true } : {}) } }));
      router.push(`/rules/${slug}/impact?published=${set.version}`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.status === 409 && err.errors[0]?.path === 'confirm') {
        await citations.mutate();
        setConfirmUnchecked(err.message);
      } else if (err instanceof ApiError && err.status === 409) setConflict('publish', err.message);
      else if (err instanceof ApiError && err.errors.length) setPublishError(err.errors.map((e) => `${e.path === 'changelog' ? 'Changelog note' : e.path}: ${e.message}`).join(' '));
      else setPublishError((err as Error).message);
      setConfirming(false);
      setPublishing(false);
    }
  }

  async function discard() {
    if (!window.confirm(`Discard draft version ${set.version}? Its edits are lost; published versions are not affected.`)) return;
    try {
      await inTurn(() => fetchJson(`${url}?revision=${revision.current}`, { method: 'DELETE' }));
      router.push(`/rules/${slug}`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.status === 409) setConflict('discard', err.message);
      else setPublishError((err as Error).message);
    }
  }

  const conflictAt = (source: Source | Source[]) =>
    conflict && ([] as Source[]).concat(source).includes(conflict.source) ? <Conflict message={conflict.message} onReload={reload} /> : null;
  const unchecked = citations.data?.uncheckedMemory ?? [];
  const changing = (dryRun?.subjects ?? []).filter((s) => s.changes.some((c) => c.statusChanged) || s.error);

  return (
    <div className="space-y-6">
      <p className="text-sm text-ink-soft" data-testid="draft-revision">Draft version {set.version}, revision {set.revision}. Saves are refused if another admin saved a newer revision.</p>

      <section className="card p-5" aria-labelledby="params-h">
        <h2 id="params-h" className="text-lg font-bold">Parameters</h2>
        <p className="mb-3 text-sm text-ink-soft">Thresholds and policies the rules read. Record a local amendment here, and cite it in the rule it changes.</p>
        <ParametersForm key={`p-${reloads}`} parameters={set.parameters} onSave={saveParameters} />
        {conflictAt('parameters')}
      </section>

      <section className="card p-5" aria-labelledby="rules-h">
        <h2 id="rules-h" className="text-lg font-bold">Rules ({set.rules.filter((r) => r.enabled).length} of {set.rules.length} enabled)</h2>
        <div className="mt-3"><RuleTable key={`r-${reloads}`} rules={set.rules} readOnly={false} onSaveRule={saveRule} onAddRule={addRule} onDeleteRule={deleteRule} /></div>
        {conflictAt('rules')}
        <div className="mt-3"><FactReference /></div>
      </section>

      <section className="card p-5" aria-labelledby="cite-h">
        <h2 id="cite-h" className="text-lg font-bold">Citations checked against the adopted text</h2>
        <p className="mt-1 text-sm text-ink-soft">
          Mark each code citation once you have read the section in the code as this jurisdiction adopted it. Reports tell the inspector which
          citations the jurisdiction checked and when; marks are kept on record and carried into the next draft while the citation stays the same.
        </p>
        {citations.data ? (
          <div className="mt-3"><CitationChecks list={citations.data} url={`${url}/citations`} readOnly={false} onChange={() => citations.mutate()} timeZone={timeZone} /></div>
        ) : (
          <p className="mt-3 text-sm text-ink-soft">{citations.error ? (citations.error as Error).message : 'Loading citations…'}</p>
        )}
      </section>

      <section className="card p-5" aria-labelledby="dry-h">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <h2 id="dry-h" className="text-lg font-bold">Dry run</h2>
          <BusyButton className="btn-secondary" onClick={() => runDryRun()} busy={dryRunState === 'running'} busyText="Running the dry run…">Dry-run this draft</BusyButton>
        </div>
        <p className="mt-1 text-sm text-ink-soft">
          Evaluates the demo plans and the latest plan revision of every open project in this jurisdiction under the published version and this draft, as a
          background job; you may leave the page and come back. The draft and the projects are not changed; the result is kept with the run.
        </p>
        {dryRunProgress && <RunProgress run={dryRunProgress} label="Dry run under way" />}
        {dryRunState === 'stale' && dryRun && (
          <p role="status" className="mt-2 text-sm text-status-caution" data-testid="dry-run-stale">
            The draft changed since this dry run (it is for revision {dryRun.draft.revision}; the draft is at revision {set.revision}); run it again.
          </p>
        )}
        {dryRun && (
          <div className="mt-3" data-testid="dry-run">
            <p className="mb-1 text-xs text-ink-faint" data-testid="dry-run-of">
              Dry run of revision {dryRun.draft.revision}{dryRunFinishedAt ? `, finished ${formatDateTime(dryRunFinishedAt, timeZone)}` : ''}
            </p>
            <p className="mb-2 text-sm font-semibold" data-testid="dry-run-totals">
              {dryRun.totals.changed} of {dryRun.totals.subjects} plans would change status · {dryRun.totals.newlyFailing} would newly fail · {dryRun.totals.newlyPassing} would newly pass
            </p>
            {dryRun.comparedWith?.kind === 'baseline' && <p className="mb-2 text-sm text-ink-soft" data-testid="dry-run-against">Nothing is published yet: compared with {dryRun.comparedWith.editions}.</p>}
            {(dryRun.adminNotes?.length ?? 0) > 0 && (
              <div className="mb-3 rounded-md bg-paper-deep px-3 py-2 text-sm" data-testid="dry-run-admin-notes">
                <p className="font-semibold">To fix in this draft (installers do not see these notes)</p>
                <ul className="mt-1 list-disc pl-5">
                  {dryRun.adminNotes!.map((n) => <li key={n.ruleKey}>{n.title}: {n.note}</li>)}
                </ul>
              </div>
            )}
            <DryRunResults subjects={dryRun.subjects} publishedVersion={dryRun.published?.version ?? null} draftVersion={dryRun.draft.version} />
          </div>
        )}
      </section>

      <section className="card p-5" aria-labelledby="pub-h">
        <h2 id="pub-h" className="text-lg font-bold">Publish</h2>
        <p className="mt-1 text-sm text-ink-soft">
          Publishing makes version {set.version} unchangeable and retires the version now published. Existing checks stay pinned to the version they ran on;
          installers see that newer rules are available. Confirm amended values against the adopted ordinance and the AHJ before publishing.
        </p>
        <label htmlFor="changelog" className="field-label mt-3">Changelog note (shown to installers)</label>
        <textarea id="changelog" rows={3} className="field-input" value={changelog} onChange={(e) => setChangelog(e.target.value)} aria-describedby={publishError ? 'publish-error' : undefined} />
        {publishError && <p id="publish-error" role="alert" className="field-error">{publishError}</p>}
        <div className="mt-3 flex flex-wrap gap-2">
          <BusyButton className="btn-secondary" onClick={saveNote} busyText="Saving note…">Save note</BusyButton>
          <BusyButton className="btn-primary" onClick={askToPublish} busy={publishing} busyText="Publishing…">{`Publish version ${set.version}`}</BusyButton>
          <BusyButton className="btn-danger" onClick={discard} busyText="Discarding…">Discard draft</BusyButton>
        </div>
        {conflictAt(['note', 'publish', 'discard'])}
        {confirming && (
          <PublishDialog
            version={set.version}
            changelog={changelog}
            dryRun={dryRunState === 'running' ? null : dryRun}
            progress={dryRunState === 'running' ? dryRunProgress : null}
            changing={changing}
            unchecked={unchecked}
            publishing={publishing}
            onPublish={() => publish(unchecked.length > 0)}
            onCancel={() => setConfirming(false)}
          />
        )}
        {confirmUnchecked && (
          <div role="alertdialog" aria-labelledby="confirm-h" aria-describedby="confirm-d" className="card mt-4 border-status-caution p-4" data-testid="publish-confirm">
            <h3 id="confirm-h" className="font-bold">Publish with citations not yet checked?</h3>
            <p id="confirm-d" className="mt-1 text-sm">
              These citations are from memory and nobody has checked them against the adopted text. Reports will tell the inspector they are not
              yet checked by the jurisdiction.
            </p>
            <ul className="mt-2 list-disc pl-5 text-sm" data-testid="publish-confirm-list">
              {(citations.data?.uncheckedMemory ?? []).map((u) => <li key={u.ruleKey}><span className="font-mono">{u.citation}</span> — {u.title}</li>)}
            </ul>
            {!citations.data && <p className="mt-2 text-sm">{confirmUnchecked}</p>}
            <div className="mt-3 flex flex-wrap gap-2">
              <BusyButton className="btn-primary" onClick={() => { setConfirmUnchecked(null); return publish(true); }} busy={publishing} busyText="Publishing…">Publish with them unchecked</BusyButton>
              <button type="button" className="btn-secondary" onClick={() => setConfirmUnchecked(null)}>Go back and check them</button>
            </div>
          </div>
        )}
      </section>
    </div>
  );
}

/**
 * Asks before publishing: the changelog installers will read, the projects whose outcome the dry
 * run says would change, and any from-memory citations nobody checked. A modal <dialog>, so focus
 * stays inside it and Escape cancels.
 */
function PublishDialog({ version, changelog, dryRun, progress, changing, unchecked, publishing, onPublish, onCancel }: {
  version: number;
  changelog: string;
  dryRun: DryRun | null;
  progress: RunStatus | null;
  changing: SubjectComparison[];
  unchecked: CitationList['uncheckedMemory'];
  publishing: boolean;
  onPublish: () => Promise<void>;
  onCancel: () => void;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const dialog = ref.current;
    if (dialog && !dialog.open) dialog.showModal();
    return () => dialog?.close();
  }, []);
  const projects = changing.filter((s) => s.kind === 'project');
  const demos = changing.filter((s) => s.kind === 'demo-plan');
  return (
    <dialog ref={ref} aria-labelledby="publish-h" aria-describedby="publish-d" className="card w-full max-w-2xl p-5 backdrop:bg-ink/40" onCancel={onCancel} data-testid="publish-dialog">
      <h3 id="publish-h" className="text-lg font-bold">Publish version {version}?</h3>
      <p id="publish-d" className="mt-1 text-sm text-ink-soft">Once published it cannot change, the version now published is retired, and installers see this note. Confirm amended values against the adopted ordinance and the AHJ first.</p>
      <h4 className="mt-3 text-sm font-semibold">Changelog note</h4>
      <blockquote className="mt-1 whitespace-pre-wrap border-l-4 border-rule pl-3 text-sm" data-testid="publish-dialog-changelog">{changelog}</blockquote>
      <h4 className="mt-3 text-sm font-semibold">Projects whose outcome would change</h4>
      {!dryRun ? (
        <>
          <p role="status" className="mt-1 text-sm">Running the dry run…</p>
          {progress && <RunProgress run={progress} label="Dry run under way" />}
        </>
      ) : (
        <div data-testid="publish-dialog-impact">
          {projects.length === 0 ? (
            <p className="mt-1 text-sm">None of the {dryRun.subjects.filter((s) => s.kind === 'project').length} open projects in this jurisdiction would change.</p>
          ) : (
            <ul className="mt-1 list-disc pl-5 text-sm">
              {projects.map((p) => (
                <li key={p.id} data-project={p.name}>
                  {p.name} ({p.detail}): {p.error ?? p.changes.filter((c) => c.statusChanged).map((c) => c.title).join(', ')}
                </li>
              ))}
            </ul>
          )}
          {demos.length > 0 && <p className="mt-1 text-xs text-ink-soft">Also {demos.length} demo plan{demos.length === 1 ? '' : 's'}.</p>}
        </div>
      )}
      {unchecked.length > 0 && (
        <div className="mt-3" data-testid="publish-confirm">
          <h4 className="text-sm font-semibold">Citations not yet checked against the adopted text</h4>
          <p className="text-sm">Reports will tell the inspector these from-memory citations are not yet checked by the jurisdiction.</p>
          <ul className="mt-1 list-disc pl-5 text-sm" data-testid="publish-confirm-list">
            {unchecked.map((u) => <li key={u.ruleKey}><span className="font-mono">{u.citation}</span> — {u.title}</li>)}
          </ul>
        </div>
      )}
      <div className="mt-4 flex flex-wrap gap-2">
        <BusyButton className="btn-primary" onClick={onPublish} busy={publishing || !dryRun} busyText={dryRun ? 'Publishing…' : 'Waiting for the dry run…'}>
          {unchecked.length > 0 ? 'Publish with them unchecked' : `Publish version ${version}`}
        </BusyButton>
        <button type="button" className="btn-secondary" onClick={onCancel} disabled={publishing}>{unchecked.length > 0 ? 'Go back and check them' : 'Cancel'}</button>
      </div>
    </dialog>
  );
}
