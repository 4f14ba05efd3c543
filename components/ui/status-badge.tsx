import { findingStatusLabels, type FindingStatus } from '@/lib/domain/vocabulary';

/**
 * NookPass's status marks: each status has its own shape as well as colour, so they read in
 * greyscale print and for colour-blind users. pass = filled circle, fail = square with a cross,
 * caution = triangle, needs-info = open diamond, not-applicable = dash.
 */
export type Status = FindingStatus;

export const statusLabel = Object.fromEntries(Object.entries(findingStatusLabels).map(([k, v]) => [k, v.label])) as Record<Status, string>;

const colour: Record<Status, string> = {
  pass: 'text-status-pass',
  fail: 'text-status-fail',
  caution: 'text-status-caution',
  'needs-info': 'text-status-info',
  'not-applicable': 'text-status-na',
};

export function StatusMark({ status, className = 'h-4 w-4' }: { status: Status; className?: string }) {
  return (
    <svg viewBox="0 0 16 16" className={`${className} ${colour[status]} shrink-0`} aria-hidden="true">
      {status === 'pass' && <circle cx="8" cy="8" r="6.5" fill="currentColor" />}
      {status === 'fail' && (
        <>
          <rect x="1.5" y="1.5" width="13" height="13" rx="1.5" fill="currentColor" />
          <path d="M5 5l6 6M11 5l-6 6" stroke="white" strokeWidth="2" strokeLinecap="round" />
        </>
      )}
      {status === 'caution' && <path d="M8 1.5l7 13H1z" fill="currentColor" />}
      {status === 'needs-info' && <path d="M8 1.5l6.5 6.5L8 14.5 1.5 8z" fill="none" stroke="currentColor" strokeWidth="2" />}
      {status === 'not-applicable' && <path d="M3 8h10" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />}
    </svg>
  );
}

export function StatusBadge({ status, label }: { status: Status; label?: string }) {
  return (
    <span className={`inline-flex items-center gap-1.5 text-sm font-semibold ${colour[status]}`} data-status={status}>
      <StatusMark status={status} />
      {label ?? statusLabel[status]}
    </span>
  );
}
