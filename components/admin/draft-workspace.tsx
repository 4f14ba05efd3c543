'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
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

type DraftSet = Omit<RuleSetWithRules, 'createdAt' | 'updatedAt' | 'publishedAt' | 'retiredAt'> & { updatedAt: string | Date };
type DryRun = { published: { version: number } | null; draft: { version: number; revision: number }; subjects: SubjectComparison[]; totals: { subjects: number; changed: number; newlyFailing: number; newlyPassing: number }; adminNotes?: Array<{ ruleKey: string; title: string; note: string }> };

/**
 * The draft editor: parameters, rules, dry run and publish, all saving against the revision this
 * page loaded. A 409 means another admin saved first; the page keeps what was typed and offers
 * to reload their version.
 */
export function DraftWorkspace({ initial, slug }: { initial: DraftSet; slug: string }) {
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
  const [conflict, setConflict] = useState<string | null>(null);
  const [reloads, setReloads] = useState(0);
  const [dryRun, setDryRun] = useState<DryRun | null>(null);
  const [dryRunState, setDryRunState] = useState<'idle' | 'running' | 'stale'>('idle');
  const [changelog, setChangelog] = useState(initial.changelog);
  const [publishError, setPublishError] = useState<string | null>(null);
  const [publishing, setPublishing] = useState(false);
  const [confirmUnchecked, setConfirmUnchecked] = useState<string | null>(null);
  const citations = useSWR<CitationList>(`${url}/citations`, swrFetcher, { revalidateOnFocus: false });

  /** Every write goes through here: on success the new revision is kept, on 409 the conflict is shown. */
  async function write(path: string, init: { method: string; json?: unknown }) {
    try {
      const next = await fetchJson<DraftSet>(path, init);
      setConflict(null);
      await mutate(next, { revalidate: false });
      if (dryRun) setDryRunState('stale');
      void citations.mutate();
      return next;
    } catch (err) {
      if (err instanceof ApiError && err.status === 409) setConflict(err.message);
      throw err;
    }
  }

  async function reload() {
    await mutate();
    setConflict(null);
    setReloads((n) => n + 1);
  }

  const saveParameters = async (parameters: RuleSetParameters) => {
    await write(url, { method: 'PATCH', json: { revision: set.revision, parameters } });
  };
  const saveRule = async (key: string, rule: RuleFormValues | StoredRule) => {
    await write(`${url}/rules/${encodeURIComponent(key)}`, { method: 'PUT', json: { revision: set.revision, rule } });
  };
  const addRule = async (rule: RuleFormValues) => {
    await write(`${url}/rules`, { method: 'POST', json: { revision: set.revision, rule } });
  };
  const deleteRule = async (key: string) => {
    await write(`${url}/rules/${encodeURIComponent(key)}?revision=${set.revision}`, { method: 'DELETE' });
  };

  async function runDryRun() {
    setDryRunState('running');
    try {
      setDryRun(await fetchJson<DryRun>(`${url}/dry-run`, { method: 'POST', json: {} }));
      setDryRunState('idle');
    } catch (err) {
      setPublishError((err as Error).message);
      setDryRunState('idle');
    }
  }

  async function publish(confirm = false) {
    setPublishError(null);
    setPublishing(true);
    try {
      await fetchJson(`${url}/publish`, { method: 'POST', json: { revision: set.revision, changelog, ...(confirm ? { confirm: true } : {}) } });
      router.push(`/rules/${slug}/impact?published=${set.version}`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.status === 409 && err.errors[0]?.path === 'confirm') {
        await citations.mutate();
        setConfirmUnchecked(err.message);
      } else if (err instanceof ApiError && err.status === 409) setConflict(err.message);
      else if (err instanceof ApiError && err.errors.length) setPublishError(err.errors.map((e) => `${e.path}: ${e.message}`).join(' '));
      else setPublishError((err as Error).message);
      setPublishing(false);
    }
  }

  async function discard() {
    if (!window.confirm(`Discard draft version ${set.version}? Its edits are lost; published versions are not affected.`)) return;
    try {
      await fetchJson(`${url}?revision=${set.revision}`, { method: 'DELETE' });
      router.push(`/rules/${slug}`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.status === 409) setConflict(err.message);
      else setPublishError((err as Error).message);
    }
  }

  return (
    <div className="space-y-6">
      <p className="text-sm text-ink-soft" data-testid="draft-revision">Draft version {set.version}, revision {set.revision}. Saves are refused if another admin saved a newer revision.</p>
      {conflict && (
        <div role="alert" className="card border-status-fail p-4" data-testid="conflict">
          <p className="font-semibold text-status-fail">Not saved: someone else changed this draft.</p>
          <p className="mt-1 text-sm">{conflict}</p>
          <button type="button" className="btn-secondary mt-3" onClick={reload}>Reload the draft</button>
        </div>
      )}

      <section className="card p-5" aria-labelledby="params-h">
        <h2 id="params-h" className="text-lg font-bold">Parameters</h2>
        <p className="mb-3 text-sm text-ink-soft">Thresholds and policies the rules read. Record a local amendment here, and cite it in the rule it changes.</p>
        <ParametersForm key={`p-${reloads}`} parameters={set.parameters} onSave={saveParameters} />
      </section>

      <section className="card p-5" aria-labelledby="rules-h">
        <h2 id="rules-h" className="text-lg font-bold">Rules ({set.rules.filter((r) => r.enabled).length} of {set.rules.length} enabled)</h2>
        <div className="mt-3"><RuleTable key={`r-${reloads}`} rules={set.rules} readOnly={false} onSaveRule={saveRule} onAddRule={addRule} onDeleteRule={deleteRule} /></div>
        <div className="mt-3"><FactReference /></div>
      </section>

      <section className="card p-5" aria-labelledby="cite-h">
        <h2 id="cite-h" className="text-lg font-bold">Citations checked against the adopted text</h2>
        <p className="mt-1 text-sm text-ink-soft">
          Mark each code citation once you have read the section in the code as this jurisdiction adopted it. Reports tell the inspector which
          citations the jurisdiction checked and when; marks are kept on record and carried into the next draft while the citation stays the same.
        </p>
        {citations.data ? (
          <div className="mt-3"><CitationChecks list={citations.data} url={`${url}/citations`} readOnly={false} onChange={() => citations.mutate()} /></div>
        ) : (
          <p className="mt-3 text-sm text-ink-soft">{citations.error ? (citations.error as Error).message : 'Loading citations…'}</p>
        )}
      </section>

      <section className="card p-5" aria-labelledby="dry-h">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <h2 id="dry-h" className="text-lg font-bold">Dry run</h2>
          <button type="button" className="btn-secondary" onClick={runDryRun} disabled={dryRunState === 'running'}>
            {dryRunState === 'running' ? 'Running…' : 'Dry-run this draft'}
          </button>
        </div>
        <p className="mt-1 text-sm text-ink-soft">Evaluates the demo plans and the latest plan revision of every open project in this jurisdiction under the published version and this draft. Nothing is stored.</p>
        {dryRunState === 'stale' && <p role="status" className="mt-2 text-sm text-status-caution">The draft changed since this dry run; run it again.</p>}
        {dryRun && (
          <div className="mt-3" data-testid="dry-run">
            <p className="mb-2 text-sm font-semibold" data-testid="dry-run-totals">
              {dryRun.totals.changed} of {dryRun.totals.subjects} plans would change status · {dryRun.totals.newlyFailing} would newly fail · {dryRun.totals.newlyPassing} would newly pass
            </p>
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
          <button type="button" className="btn-secondary" onClick={() => write(url, { method: 'PATCH', json: { revision: set.revision, changelog } }).catch((err) => setPublishError((err as Error).message))}>Save note</button>
          <button type="button" className="btn-primary" onClick={() => publish()} disabled={publishing}>{publishing ? 'Publishing…' : `Publish version ${set.version}`}</button>
          <button type="button" className="btn-danger" onClick={discard}>Discard draft</button>
        </div>
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
              <button type="button" className="btn-primary" onClick={() => { setConfirmUnchecked(null); void publish(true); }} disabled={publishing}>Publish with them unchecked</button>
              <button type="button" className="btn-secondary" onClick={() => setConfirmUnchecked(null)}>Go back and check them</button>
            </div>
          </div>
        )}
      </section>
    </div>
  );
}
