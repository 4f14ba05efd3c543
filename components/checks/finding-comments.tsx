import type { InspectorFindingComment } from '@/lib/domain/reports/finding-comments';
import { formatDate } from '@/lib/domain/dates/format';

/** The inspectors' comments on one finding, shown under it: who, when, on which report, and what they said. */
export function FindingComments({ comments, timeZone }: { comments: InspectorFindingComment[] | undefined; timeZone: string }) {
  if (!comments?.length) return null;
  return (
    <div className="mt-3 space-y-2" data-testid="inspector-comments">
      {comments.map((c, i) => (
        <figure key={`${c.at}-${i}`} className="rounded-md border-l-4 border-brass bg-brass-soft/40 px-3 py-2 text-sm" data-testid="inspector-comment">
          <figcaption className="text-xs text-ink-soft">
            <span className="font-semibold text-ink">Inspector’s comment</span> · {c.inspectorName ?? 'Inspector'} ·{' '}
            <time dateTime={c.at}>{formatDate(c.at, timeZone)}</time> · {c.outcome === 'approved' ? 'approved' : 'corrections needed'}, report {c.reportCode}
          </figcaption>
          <blockquote className="mt-1 whitespace-pre-line">{c.comment}</blockquote>
        </figure>
      ))}
    </div>
  );
}
