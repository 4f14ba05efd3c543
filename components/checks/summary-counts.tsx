import { StatusMark, type Status } from '@/components/ui/status-badge';
import type { EvaluationSummary } from '@/lib/domain/engine';

const items: Array<[keyof EvaluationSummary, Status, string]> = [
  ['fail', 'fail', 'fail'],
  ['caution', 'caution', 'cautions'],
  ['needsInfo', 'needs-info', 'need info'],
  ['pass', 'pass', 'pass'],
  ['notApplicable', 'not-applicable', 'not applicable'],
];

export function SummaryCounts({ summary }: { summary: EvaluationSummary }) {
  return (
    <ul className="flex flex-wrap gap-3" data-testid="summary-counts" aria-label="Summary">
      {items.map(([key, status, label]) => (
        <li key={key} className="card flex items-center gap-2 px-4 py-2" data-count={key}>
          <StatusMark status={status} className="h-5 w-5" />
          <span className="font-mono text-xl font-bold">{summary[key]}</span>
          <span className="text-sm text-ink-soft">{label}</span>
        </li>
      ))}
    </ul>
  );
}
