import Link from 'next/link';
import {
  inspectionOutcomeFilterLabels,
  inspectionOutcomeFilters,
  MAX_INSPECTION_SEARCH_LENGTH,
  type InspectionFilter,
  type InspectionFilterProblem,
} from '@/lib/domain/reports/inspection-filter';

/**
 * The queue's filters as a plain GET form: it works without JavaScript and the filter lives in the URL, so a
 * filtered queue can be bookmarked or sent to a colleague. Values that did not parse are shown as typed.
 */
export function InspectionFilters({ filter, typed, errors }: { filter: InspectionFilter; typed: Record<string, string | undefined>; errors: InspectionFilterProblem[] }) {
  const errorOf = (path: string) => errors.find((e) => e.path === path)?.message;
  const field = (path: 'q' | 'outcome' | 'from' | 'to') => {
    const message = errorOf(path);
    return {
      'aria-invalid': message ? true : undefined,
      'aria-describedby': message ? `inspections-${path}-error` : undefined,
    } as const;
  };
  const shown = (path: 'q' | 'from' | 'to') => (errorOf(path) ? typed[path] ?? '' : filter[path] ?? '');
  return (
    <form method="get" action="/inspections" role="search" aria-label="Search and filter the reports" className="card mb-4 grid gap-3 p-4 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_1fr_auto] lg:items-end">
      <div className="sm:col-span-2 lg:col-span-1">
        <label htmlFor="inspections-q" className="field-label">Search</label>
        <input
          id="inspections-q"
          name="q"
          type="search"
          defaultValue={shown('q')}
          maxLength={MAX_INSPECTION_SEARCH_LENGTH}
          placeholder="Report code, project, address, permit, company"
          className="field-input"
          {...field('q')}
        />
        {errorOf('q') && <p id="inspections-q-error" className="field-error">{errorOf('q')}</p>}
      </div>
      <div>
        <label htmlFor="inspections-outcome" className="field-label">Outcome</label>
        <select id="inspections-outcome" name="outcome" defaultValue={filter.outcome ?? ''} className="field-input" {...field('outcome')}>
          <option value="">Any outcome</option>
          {inspectionOutcomeFilters.map((o) => <option key={o} value={o}>{inspectionOutcomeFilterLabels[o]}</option>)}
        </select>
        {errorOf('outcome') && <p id="inspections-outcome-error" className="field-error">{errorOf('outcome')}</p>}
      </div>
      <div>
        <label htmlFor="inspections-from" className="field-label">Received from</label>
        <input id="inspections-from" name="from" type="date" defaultValue={shown('from')} className="field-input" {...field('from')} />
        {errorOf('from') && <p id="inspections-from-error" className="field-error">{errorOf('from')}</p>}
      </div>
      <div>
        <label htmlFor="inspections-to" className="field-label">Received to</label>
        <input id="inspections-to" name="to" type="date" defaultValue={shown('to')} className="field-input" {...field('to')} />
        {errorOf('to') && <p id="inspections-to-error" className="field-error">{errorOf('to')}</p>}
      </div>
      <div className="flex gap-2 sm:col-span-2 lg:col-span-1">
        <button type="submit" className="btn-primary">Search</button>
        <Link href="/inspections" className="btn-secondary">Clear</Link>
      </div>
      {errors.length > 0 && (
        <div role="alert" className="field-error sm:col-span-2 lg:col-span-5" data-testid="inspections-filter-errors">
          {errors.length === 1 ? 'One filter was not applied' : `${errors.length} filters were not applied`}: {errors.map((e) => e.message).join(' ')}
        </div>
      )}
    </form>
  );
}
