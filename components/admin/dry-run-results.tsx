import { statusLabel, StatusMark } from '@/components/ui/status-badge';
import type { FindingDelta, Outcome, SubjectComparison } from '@/lib/domain/rule-sets/dry-run';

const outcomeLabel: Record<Outcome, string> = { pass: 'passes', fail: 'fails', incomplete: 'incomplete' };

function OutcomeText({ side }: { side: SubjectComparison['before'] }) {
  return <span>{side ? outcomeLabel[side.outcome] : '—'}</span>;
}

export function FindingChanges({ changes }: { changes: FindingDelta[] }) {
  return (
    <ul className="mt-1 space-y-1 text-sm">
      {changes.map((c) => (
        <li key={c.ruleKey} data-change={c.ruleKey} data-from={c.from?.status ?? 'none'} data-to={c.to?.status ?? 'none'}>
          <span className="font-semibold">{c.title}</span>{' '}
          <span className="inline-flex items-center gap-1">
            {c.from ? <><StatusMark status={c.from.status} className="h-3 w-3" />{statusLabel[c.from.status]}</> : 'new rule'}
            {' → '}
            {c.to ? <><StatusMark status={c.to.status} className="h-3 w-3" />{statusLabel[c.to.status]}</> : 'rule removed'}
          </span>
          {(c.from?.limit !== c.to?.limit || c.from?.measured !== c.to?.measured) && (
            <span className="text-ink-soft"> · measured {c.to?.measured ?? c.from?.measured ?? '—'}, limit {c.from?.limit ?? '—'} → {c.to?.limit ?? '—'}</span>
          )}
          {c.from && c.to && c.from.citation !== c.to.citation && <span className="text-ink-soft"> · cites {c.from.citation} → {c.to.citation}</span>}
        </li>
      ))}
    </ul>
  );
}

/** Per plan: outcome under the published version and under the draft, and the findings that would change. */
export function DryRunResults({ subjects, publishedVersion, draftVersion }: { subjects: SubjectComparison[]; publishedVersion: number | null; draftVersion: number }) {
  return (
    <table className="min-w-full text-sm" aria-label="Dry run results">
      <thead className="text-left text-xs uppercase tracking-wide text-ink-faint">
        <tr><th className="py-2 pr-3">Plan</th><th className="pr-3">v{publishedVersion ?? '—'}</th><th className="pr-3">v{draftVersion}</th><th>Findings that would change</th></tr>
      </thead>
      <tbody className="divide-y divide-rule">
        {subjects.map((s) => {
          const flipped = s.changes.some((c) => c.statusChanged);
          return (
            <tr key={`${s.kind}-${s.id}`} data-subject={s.name} data-changed={flipped} className={flipped ? 'bg-brass-soft/40' : ''}>
              <td className="py-2 pr-3 align-top">
                <div className="font-semibold">{s.name}</div>
                <div className="text-xs text-ink-faint">{s.detail}</div>
              </td>
              <td className="pr-3 align-top"><OutcomeText side={s.before} /></td>
              <td className="pr-3 align-top" data-testid="outcome-after"><OutcomeText side={s.after} /></td>
              <td className="align-top">
                {s.error && <p className="text-status-fail">{s.error}</p>}
                {s.changes.length === 0 && !s.error ? <span className="text-ink-faint">no change</span> : <FindingChanges changes={s.changes} />}
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
