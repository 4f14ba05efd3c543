import Link from 'next/link';
import { inspectionFilterQuery, type InspectionFilter } from '@/lib/domain/reports/inspection-filter';

/** Previous / next links that keep the filter; plain links, so paging works without JavaScript. */
export function InspectionsPager({ filter, total, page, pageSize }: { filter: InspectionFilter; total: number; page: number; pageSize: number }) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  const href = (p: number) => `/inspections${inspectionFilterQuery({ ...filter, page: p })}`;
  return (
    <nav aria-label="Pages of reports" className="mt-4 flex flex-wrap items-center justify-between gap-3 text-sm">
      <p role="status" data-testid="inspections-count">
        {total === 0 ? 'No reports' : `Reports ${first}–${last} of ${total}`}
        {pages > 1 && ` · page ${Math.min(page, pages)} of ${pages}`}
      </p>
      <div className="flex gap-2">
        {page > 1 && <Link className="btn-secondary" href={href(Math.min(page - 1, pages))} rel="prev">Newer</Link>}
        {page < pages && <Link className="btn-secondary" href={href(page + 1)} rel="next">Older</Link>}
      </div>
    </nav>
  );
}
