'use client';

import { memo, useEffect, useState } from 'react';
import { useFormContext } from 'react-hook-form';
import type { Finding, RuleSetForEvaluation } from '@/lib/domain/engine';
import type { UnitSystem } from '@/lib/domain/units';
import type { PlanFix } from '@/lib/domain/remedies/plan-fixes';
import { DrawingSvg } from '@/components/drawings/drawing-svg';
import { StatusMark } from '@/components/ui/status-badge';
import { formToPlan, type FormValues } from '@/components/plan-editor/form-values';
import { REVEAL_FIELD_EVENT, type LiveCheckState } from '@/components/live-check/live-check-context';
import { DoorLeavesProposal, SizesWorkedOut } from '@/components/live-check/sizes-worked-out';
import { areaFormText, focusPathsFor, formatArea, formatLength, labelForPath, lengthFormText, loadRuleSet, runExtras, runLive, type LiveExtras, type LiveResult } from '@/components/live-check/live-engine';

type Outcome = LiveResult | { errors: Array<{ path: string; message: string }> };

/** A change the installer applied from the panel, kept so it can be undone. */
export interface AppliedChange {
  label: string;
  changes: Array<{ path: string; before: unknown; after: unknown }>;
}

const fieldId = (path: string) => `f-${path.replace(/\./g, '-')}`;

/** Opens and focuses the form field a finding concerns: the first of its plan fields the editor shows. */
function jumpTo(paths: string[]) {
  for (const path of paths) {
    const parts = path.replace(/\*/g, '0').split('.');
    for (let n = parts.length; n > 0; n--) {
      const id = fieldId(parts.slice(0, n).join('.'));
      const el = document.getElementById(id);
      if (!el) continue;
      window.dispatchEvent(new CustomEvent(REVEAL_FIELD_EVENT, { detail: { id } }));
      requestAnimationFrame(() => {
        const target = el.matches('input, select, textarea, button') ? el : (el.querySelector('input, select, textarea, button') as HTMLElement | null);
        (target ?? el).scrollIntoView({ block: 'center' });
        (target ?? el).focus({ preventScroll: true });
      });
      return;
    }
  }
}

// Drawings and sizes change only when their own results do, not with every finding update.
const LiveDrawings = memo(function LiveDrawings({ extras }: { extras: LiveExtras }) {
  if (!extras.elevation && !extras.planView) return null;
  return (
    <div className="mt-4 grid grid-cols-2 gap-2" data-testid="live-drawings">
      {extras.elevation && (
        <figure aria-label="Front elevation, failing parts marked">
          <DrawingSvg drawing={extras.elevation} id="live-elevation" className="h-auto w-full" />
          <figcaption className="text-center text-xs text-ink-faint">Front</figcaption>
        </figure>
      )}
      {extras.planView && (
        <figure aria-label="Plan view, failing parts marked">
          <DrawingSvg drawing={extras.planView} id="live-plan-view" className="h-auto w-full" />
          <figcaption className="text-center text-xs text-ink-faint">Plan view</figcaption>
        </figure>
      )}
    </div>
  );
});
const MemoSizes = memo(SizesWorkedOut);

const yesNo = (v: boolean) => (v ? 'yes' : 'no');

/** What applying a fix does, in the plan's units: the button's words and the note kept for undo. */
function describeFix(fix: PlanFix, units: UnitSystem): { action: string; change: string } {
  const field = fix.label.toLowerCase();
  switch (fix.kind) {
    case 'length':
      return { action: `Set ${field} to ${formatLength(fix.toIn, units)}`, change: `${fix.label}: ${formatLength(fix.fromIn, units)} → ${formatLength(fix.toIn, units)}` };
    case 'area':
      return { action: `Set ${field} to ${formatArea(fix.toSqIn, units)}`, change: `${fix.label}: ${formatArea(fix.fromSqIn, units)} → ${formatArea(fix.toSqIn, units)}` };
    case 'boolean':
      return { action: `Set ${field} to ${yesNo(fix.to)}`, change: `${fix.label}: ${yesNo(fix.from)} → ${yesNo(fix.to)}` };
    case 'remove-item':
      return { action: `Remove ${field}`, change: `${labelForPath(fix.path)}: ${field} taken out` };
  }
}

const ORDER: Record<Finding['status'], number> = { fail: 0, caution: 1, 'needs-info': 2, pass: 3, 'not-applicable': 4 };

function FindingItem({ finding, ruleSet, fixes = [], units, onApply }: { finding: Finding; ruleSet: RuleSetForEvaluation; fixes?: PlanFix[]; units: UnitSystem; onApply: (fix: PlanFix) => void }) {
  return (
    <li className="rounded-md border border-rule bg-white p-3" data-testid="live-finding" data-rule={finding.ruleKey} data-status={finding.status}>
      <button type="button" className="flex w-full items-start gap-2 text-left" onClick={() => jumpTo(focusPathsFor(ruleSet, finding))}>
        <StatusMark status={finding.status} className="mt-0.5 h-4 w-4" />
        <span>
          <span className="block text-sm font-semibold underline decoration-rule underline-offset-2">{finding.title}</span>
          <span className="block text-sm text-ink-soft">{finding.message}</span>
        </span>
      </button>
      {finding.remedy && <p className="mt-2 pl-6 text-sm"><span className="font-semibold">Fix: </span>{finding.remedy}</p>}
      {fixes.length > 0 && (
        <div className="mt-2 flex flex-wrap gap-2 pl-6">
          {fixes.map((fix) => (
            <button key={`${fix.kind}:${fix.path}`} type="button" className="btn-secondary min-h-[44px] px-3 py-1 text-sm" onClick={() => onApply(fix)} data-testid="apply-fix" data-fix-kind={fix.kind}>
              {describeFix(fix, units).action}
              {fix.clears.length > 1 ? ` (clears ${fix.clears.length} findings)` : ''}
            </button>
          ))}
        </div>
      )}
    </li>
  );
}

function LiveCheckBody({ slug, version, onState }: { slug: string; version: number; onState: (s: LiveCheckState) => void }) {
  const form = useFormContext<FormValues>();
  const [ruleSet, setRuleSet] = useState<RuleSetForEvaluation | null>(null);
  const [loadError, setLoadError] = useState<string | null>(null);
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const [extras, setExtras] = useState<LiveExtras | null>(null);
  const [runs, setRuns] = useState(0);
  const [applied, setApplied] = useState<AppliedChange[]>([]);

  useEffect(() => {
    let live = true;
    loadRuleSet(slug, version).then(
      (set) => live && setRuleSet(set),
      (err: Error) => live && setLoadError(err.message),
    );
    return () => {
      live = false;
    };
  }, [slug, version]);

  useEffect(() => {
    if (!ruleSet) return;
    let disposed = false;
    let running = false;
    let again = false;
    let extrasTimer: ReturnType<typeof setTimeout> | undefined;
    let lastCounts = '';
    // Every change starts an evaluation at once (it settles before the next frame is painted); changes that
    // arrive while one runs are taken together by the next.
    const run = async () => {
      if (running) {
        again = true;
        return;
      }
      running = true;
      try {
        do {
          again = false;
          const result = await runLive(ruleSet, formToPlan(form.getValues()));
          if (disposed) return;
          setOutcome(result);
          setRuns((n) => n + 1);
          // Section headers re-render only when their counts change, not on every keystroke.
          const counts = 'evaluation' in result ? JSON.stringify(result.bySection) : lastCounts;
          if ('evaluation' in result && counts !== lastCounts) {
            lastCounts = counts;
            onState({ state: 'ready', bySection: result.bySection });
          }
          clearTimeout(extrasTimer);
          if ('evaluation' in result) {
            // Sizes, fixes and drawings follow a moment later, so typing is never held up by them.
            extrasTimer = setTimeout(() => {
              runExtras(ruleSet, result).then((x) => !disposed && !running && setExtras(x), () => !disposed && setExtras(null));
            }, 30);
          }
        } while (again && !disposed);
      } finally {
        running = false;
      }
    };
    void run();
    const subscription = form.watch(() => void run());
    return () => {
      disposed = true;
      clearTimeout(extrasTimer);
      subscription.unsubscribe();
    };
  }, [ruleSet, form, onState]);

  const units = ((form.getValues('units') as UnitSystem) || 'imperial') as UnitSystem;

  function applyChanges(label: string, changes: Array<{ path: string; after: unknown }>) {
    const withBefore = changes.map((c) => ({ ...c, before: structuredClone(form.getValues(c.path)) }));
    for (const c of changes) form.setValue(c.path, c.after as never, { shouldDirty: true, shouldValidate: true });
    setApplied((list) => [...list.slice(-9), { label, changes: withBefore }]);
  }

  function applyFix(fix: PlanFix) {
    const after =
      fix.kind === 'length' ? lengthFormText(fix.toIn, units)
      : fix.kind === 'area' ? areaFormText(fix.toSqIn, units)
      : fix.kind === 'boolean' ? yesNo(fix.to)
      : ((form.getValues(fix.path) as unknown[]) ?? []).filter((_, i) => i !== fix.index);
    applyChanges(describeFix(fix, units).change, [{ path: fix.path, after }]);
    const id = fieldId(fix.path);
    requestAnimationFrame(() => document.getElementById(id)?.scrollIntoView({ block: 'center', behavior: 'smooth' }));
  }

  function undo() {
    const last = applied[applied.length - 1];
    if (!last) return;
    for (const c of [...last.changes].reverse()) form.setValue(c.path, c.before as never, { shouldDirty: true, shouldValidate: true });
    setApplied((list) => list.slice(0, -1));
  }

  if (loadError) return <p className="text-sm text-status-fail" role="alert">The live check could not load its rules: {loadError} The plan can still be saved and checked.</p>;
  if (!ruleSet || !outcome) return <p className="text-sm text-ink-soft" data-testid="live-loading">Loading the rules…</p>;

  if (!('evaluation' in outcome)) {
    return (
      <div data-testid="live-result" data-runs={runs}>
        <p className="text-sm" role="status">The plan cannot be checked until these fields read as values:</p>
        <ul className="mt-2 list-disc pl-5 text-sm">{outcome.errors.map((e) => <li key={e.path}>{e.message}</li>)}</ul>
      </div>
    );
  }

  const { evaluation, waiting } = outcome;
  // Per finding, the first fix of each kind (shorten a piece, or take an elbow out), so the choices stay few.
  const fixFor = new Map<string, PlanFix[]>();
  for (const fix of extras?.fixes ?? []) {
    for (const key of fix.clears) {
      const list = fixFor.get(key) ?? [];
      if (!list.some((f) => f.kind === fix.kind)) fixFor.set(key, [...list, fix]);
    }
  }
  const sorted = [...evaluation.findings].sort((a, b) => ORDER[a.status] - ORDER[b.status]);
  const failing = sorted.filter((f) => f.status === 'fail' || f.status === 'caution');
  const needsInfo = sorted.filter((f) => f.status === 'needs-info');
  const passing = sorted.filter((f) => f.status === 'pass');
  const s = evaluation.summary;
  const last = applied[applied.length - 1];

  return (
    <div data-testid="live-result" data-runs={runs} data-fail={s.fail} data-caution={s.caution}>
      <p className="text-sm font-semibold" role="status" aria-live="polite" data-testid="live-summary">
        {s.fail} fail · {s.caution} caution · {s.needsInfo} need information · {s.pass} pass
      </p>
      <p className="mt-1 text-xs text-ink-faint">
        Rule set version {evaluation.ruleSet.version}, computed in this browser as you type; “Save and check” stores the check that counts.
      </p>

      {last && (
        <div className="mt-3 flex flex-wrap items-center gap-2 rounded-md border border-brass bg-brass-soft/40 px-3 py-2 text-sm" role="status" data-testid="applied-change">
          <span>Changed {last.label}.</span>
          <button type="button" className="btn-secondary min-h-[44px] px-3 py-1 text-sm" onClick={undo}>Undo</button>
        </div>
      )}

      {waiting.length > 0 && (
        <div className="mt-3 rounded-md border border-status-info/40 bg-white p-3 text-sm" data-testid="live-waiting">
          {waiting.map((w) => (
            <p key={w.path} className="mt-1 first:mt-0">
              <button type="button" className="font-semibold underline" onClick={() => jumpTo([w.path])}>{labelForPath(w.path)}</button>
              {' '}does not read as a value yet ({w.message})
              {w.findings.length > 0 ? <>; waiting for it: {w.findings.map((f) => f.title).join('; ')}.</> : '.'}
            </p>
          ))}
        </div>
      )}

      {failing.length > 0 ? (
        <ol className="mt-3 space-y-2" aria-label="Failing findings">
          {failing.map((f) => <FindingItem key={f.ruleKey} finding={f} ruleSet={ruleSet} fixes={fixFor.get(f.ruleKey)} units={units} onApply={applyFix} />)}
        </ol>
      ) : (
        <p className="mt-3 text-sm text-status-pass">Nothing fails or needs caution in what the plan gives so far.</p>
      )}

      {needsInfo.length > 0 && (
        <details className="mt-3">
          <summary className="cursor-pointer text-sm font-semibold">{needsInfo.length} need information</summary>
          <ol className="mt-2 space-y-2">
            {needsInfo.map((f) => <FindingItem key={f.ruleKey} finding={f} ruleSet={ruleSet} units={units} onApply={applyFix} />)}
          </ol>
        </details>
      )}
      {passing.length > 0 && (
        <details className="mt-2">
          <summary className="cursor-pointer text-sm font-semibold">{passing.length} pass</summary>
          <ul className="mt-2 space-y-1 text-sm">{passing.map((f) => <li key={f.ruleKey} data-testid="live-finding" data-rule={f.ruleKey} data-status="pass">{f.title}</li>)}</ul>
        </details>
      )}

      {extras && <LiveDrawings extras={extras} />}
      {extras && <MemoSizes sizing={extras.sizing} units={units} />}
      <DoorLeavesProposal params={ruleSet.parameters} plan={outcome.plan} units={units} onAccept={applyChanges} />

      <p className="mt-4 text-xs text-ink-faint">
        An aid while planning, not an approval: the locally adopted code, the AHJ and licensed trades govern.
      </p>
    </div>
  );
}

export default memo(LiveCheckBody);
