'use client';

import { useMemo, useState } from 'react';
import type { Finding } from '@/lib/domain/engine';
import { StatusBadge, type Status } from '@/components/ui/status-badge';
import { areaOrder, areaTitles, citationText, confidenceLabel } from '@/lib/domain/vocabulary';
import { amendmentCitationText, checkedOnFor, citationStatusText } from '@/lib/domain/rule-sets/citation-checks';
import type { FindingCommentsByKey } from '@/lib/domain/reports/finding-comments';
import { FindingComments } from '@/components/checks/finding-comments';
import { DEFAULT_TIME_ZONE, formatDate } from '@/lib/domain/dates/format';

type Filter = 'all' | 'problems' | 'fail';

const filterLabel: Record<Filter, string> = { all: 'All findings', problems: 'Fails, cautions and missing info', fail: 'Only what fails' };

/**
 * `citationChecks` is given where the findings are shown as a report (to the inspector): each citation
 * then says whether the jurisdiction checked it against its adopted code, instead of the source
 * confidence admins and installers see.
 */
export function FindingsList({ findings, changedKeys, citationChecks, comments, timeZone = DEFAULT_TIME_ZONE }: { findings: Finding[]; changedKeys?: string[]; citationChecks?: Record<string, { citation: string; checkedOn: string }>; comments?: FindingCommentsByKey; timeZone?: string }) {
  const [filter, setFilter] = useState<Filter>(findings.some((f) => f.status === 'fail') ? 'problems' : 'all');
  const changed = useMemo(() => new Set(changedKeys ?? []), [changedKeys]);
  const shown = findings.filter((f) =>
    // A finding an inspector commented on stays in view under every filter, even when it passed.
    filter === 'all' || !!comments?.[f.ruleKey]?.length ? true : filter === 'fail' ? f.status === 'fail' : ['fail', 'caution', 'needs-info'].includes(f.status),
  );
  const byArea = areaOrder
    .map((area) => ({ area, items: shown.filter((f) => f.area === area) }))
    .filter((g) => g.items.length > 0);

  return (
    <div>
      <fieldset className="no-print mb-4 flex flex-wrap gap-2" aria-label="Show findings">
        <legend className="sr-only">Show findings</legend>
        {(Object.keys(filterLabel) as Filter[]).map((f) => (
          <label key={f} className={`cursor-pointer rounded-full border px-3 py-1 text-sm ${filter === f ? 'border-ink bg-ink text-paper' : 'border-rule bg-white'}`}>
            <input type="radio" name="finding-filter" value={f} checked={filter === f} onChange={() => setFilter(f)} className="sr-only" />
            {filterLabel[f]}
          </label>
        ))}
      </fieldset>
      {byArea.length === 0 && <p className="card p-6 text-sm text-ink-soft">Nothing to show with this filter.</p>}
      <div className="space-y-6">
        {byArea.map(({ area, items }) => (
          <section key={area} aria-labelledby={`area-${area}`}>
            <h3 id={`area-${area}`} className="mb-2 text-lg font-bold">{areaTitles[area] ?? area}</h3>
            <ul className="space-y-3">
              {items.map((f) => (
                <li key={f.ruleKey} id={`finding-${f.ruleKey}`} className={`card p-4 ${f.status === 'fail' ? 'border-l-4 border-l-status-fail' : ''}`} data-testid="finding" data-rule={f.ruleKey} data-status={f.status}>
                  <div className="flex flex-wrap items-start justify-between gap-2">
                    <div>
                      <StatusBadge status={f.status as Status} />
                      <h4 className="mt-1 font-semibold">{f.title}</h4>
                    </div>
                    <div className="text-right text-xs text-ink-soft">
                      <div className="font-mono font-semibold text-ink" data-testid="citation">{citationText(f.citation)}</div>
                      {amendmentCitationText(f) && <div className="font-mono text-ink" data-testid="amendment-citation">Local amendment {amendmentCitationText(f)}</div>}
                      {citationChecks
                        ? <div data-testid="citation-status">{citationStatusText(f.citation, checkedOnFor(f, citationChecks), (at) => formatDate(at, timeZone))}</div>
                        : <div>{confidenceLabel[f.confidence] ?? f.confidence}</div>}
                      {changed.has(f.ruleKey) && <div className="mt-1 inline-block rounded bg-brass-soft px-1.5 font-semibold text-ink">changed since last check</div>}
                    </div>
                  </div>
                  {(f.display.measured || f.display.limit) && (
                    <dl className="mt-2 flex flex-wrap gap-x-6 gap-y-1 text-sm">
                      {f.display.measured && (
                        <div><dt className="inline text-ink-faint">Measured </dt><dd className="inline font-mono font-semibold" data-testid="measured">{f.display.measured}</dd></div>
                      )}
                      {f.display.limit && (
                        <div><dt className="inline text-ink-faint">Limit </dt><dd className="inline font-mono font-semibold" data-testid="limit">{f.display.limit}</dd></div>
                      )}
                    </dl>
                  )}
                  <p className="mt-2 text-sm">{f.message}</p>
                  {f.remedy && (
                    <p className="mt-2 rounded-md bg-paper-deep px-3 py-2 text-sm" data-testid="remedy">
                      <span className="font-semibold">Smallest fix: </span>{f.remedy}
                    </p>
                  )}
                  {f.citationNote && <p className="mt-1 text-xs text-ink-faint">{f.citationNote}</p>}
                  <FindingComments comments={comments?.[f.ruleKey]} timeZone={timeZone} />
                </li>
              ))}
            </ul>
          </section>
        ))}
      </div>
    </div>
  );
}
