'use client';

import Link from 'next/link';
import { useEffect, useState } from 'react';
import useSWR from 'swr';
import { swrFetcher } from '@/lib/platform/client/fetch-json';
import { ProjectsCsvLink } from '@/components/projects/projects-csv-link';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatDate } from '@/lib/domain/dates/format';

type Item = {
  id: string;
  name: string;
  siteAddress: string;
  jurisdiction: { slug: string; name: string; timeZone: string };
  latestCheck: {
    outcome: 'pass' | 'fail' | 'incomplete';
    summary: { fail: number; needsInfo: number; caution: number; pass: number };
    createdAt: string;
  } | null;
  inspection: { status: 'not-sent' | 'awaiting-inspector' | 'approved' | 'corrections-needed'; reportCode: string | null };
  updatedAt: string;
  archivedAt: string | null;
  isDemo: boolean;
};
type Page = { items: Item[]; total: number; page: number; pageSize: number };
type Sort = 'updated' | 'name' | 'jurisdiction' | 'created';

// "Passes" only when nothing fails and nothing needs information; cautions are said, never hidden.
function CheckResult({ check }: { check: Item['latestCheck'] }) {
  if (!check) return <span className="text-sm text-ink-soft">Not checked yet</span>;
  const s = check.summary;
  const badge =
    s.fail > 0 ? <StatusBadge status="fail" label="Has failures" />
    : s.needsInfo > 0 ? <StatusBadge status="needs-info" label="Needs information" />
    : s.caution > 0 ? <StatusBadge status="caution" label="Passes, with cautions" />
    : <StatusBadge status="pass" label="Passes" />;
  return (
    <span className="flex flex-col gap-0.5">
      {badge}
      <span className="text-xs text-ink-soft" data-testid="check-counts">
        {s.fail} fail · {s.needsInfo} need{s.needsInfo === 1 ? 's' : ''} information · {s.caution} caution · {s.pass} pass
      </span>
    </span>
  );
}

const inspectionText: Record<Item['inspection']['status'], string> = {
  'not-sent': 'Not sent to the inspector',
  'awaiting-inspector': 'Awaiting the inspector',
  approved: 'Approved by the inspector',
  'corrections-needed': 'Inspector asked for corrections',
};

function Inspection({ inspection }: { inspection: Item['inspection'] }) {
  const text = inspectionText[inspection.status];
  const tone =
    inspection.status === 'approved' ? 'text-status-pass'
    : inspection.status === 'corrections-needed' ? 'text-status-fail'
    : 'text-ink-soft';
  return (
    <span className="flex flex-col gap-0.5" data-testid="inspection" data-inspection={inspection.status}>
      <span className={`text-sm font-semibold ${tone}`}>{text}</span>
      {inspection.reportCode && <span className="font-mono text-xs text-ink-soft">Report {inspection.reportCode}</span>}
    </span>
  );
}

export function ProjectsTable() {
  const [search, setSearch] = useState('');
  const [q, setQ] = useState('');
  const [sort, setSort] = useState<Sort>('updated');
  const [dir, setDir] = useState<'asc' | 'desc'>('desc');
  const [page, setPage] = useState(1);
  const [archived, setArchived] = useState(false);

  useEffect(() => {
    const t = setTimeout(() => {
      setQ(search);
      setPage(1);
    }, 250);
    return () => clearTimeout(t);
  }, [search]);

  const params = new URLSearchParams({ q, sort, dir, page: String(page), pageSize: '20', archived: archived ? 'all' : '0' });
  const { data, error, isLoading } = useSWR<Page>(`/api/projects?${params}`, swrFetcher, { keepPreviousData: true });

  function sortBy(column: Sort) {
    if (sort === column) setDir(dir === 'asc' ? 'desc' : 'asc');
    else {
      setSort(column);
      setDir(column === 'name' || column === 'jurisdiction' ? 'asc' : 'desc');
    }
    setPage(1);
  }

  const header = (column: Sort, label: string) => (
    <th scope="col" className={`px-4 py-3 ${column === 'name' ? '' : 'hidden md:table-cell'}`} aria-sort={sort === column ? (dir === 'asc' ? 'ascending' : 'descending') : 'none'}>
      <button type="button" onClick={() => sortBy(column)} className="inline-flex items-center gap-1 font-semibold uppercase tracking-wide">
        {label}
        <span aria-hidden="true">{sort === column ? (dir === 'asc' ? '▲' : '▼') : '↕'}</span>
      </button>
    </th>
  );

  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-4">
        <div className="min-w-[16rem] flex-1">
          <label htmlFor="project-search" className="field-label">Search projects</label>
          <input
            id="project-search"
            type="search"
            className="field-input"
            placeholder="Name, address, jurisdiction or permit"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
          />
        </div>
        <label className="inline-flex items-center gap-2 pb-2 text-sm">
          <input type="checkbox" checked={archived} onChange={(e) => { setArchived(e.target.checked); setPage(1); }} className="h-4 w-4" />
          Show archived
        </label>
        <ProjectsCsvLink q={q} sort={sort} dir={dir} archived={archived ? 'all' : '0'} />
      </div>

      {error && <p role="alert" className="rounded-md bg-status-fail/10 px-4 py-3 text-sm text-status-fail">Projects could not be loaded: {(error as Error).message}</p>}
      {isLoading && !data && <p className="text-sm text-ink-soft" role="status">Loading projects…</p>}

      {data && data.items.length === 0 && (
        <div className="card border-dashed p-8 text-sm text-ink-soft">
          {q || archived ? 'No project matches. Clear the search or include archived projects.' : 'No projects yet. Start one for your next laundry-closet job with “New project”.'}
        </div>
      )}

      {data && data.items.length > 0 && (
        <div className="card overflow-x-auto">
          <table className="min-w-full text-sm">
            <caption className="sr-only">Your company’s projects</caption>
            <thead className="bg-paper-deep text-left text-xs text-ink-soft">
              <tr>
                {header('name', 'Project')}
                <th scope="col" className="hidden px-4 py-3 font-semibold uppercase tracking-wide md:table-cell">Site address</th>
                {header('jurisdiction', 'Jurisdiction')}
                <th scope="col" className="hidden px-4 py-3 font-semibold uppercase tracking-wide md:table-cell">Latest check</th>
                <th scope="col" className="hidden px-4 py-3 font-semibold uppercase tracking-wide md:table-cell">Inspection</th>
                {header('updated', 'Updated')}
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {data.items.map((p) => (
                <tr key={p.id} className={p.archivedAt ? 'opacity-60' : undefined}>
                  <td className="px-4 py-3">
                    <Link href={`/projects/${p.id}`} className="font-semibold text-ink underline-offset-2 hover:underline">{p.name}</Link>
                    {p.isDemo && <span className="ml-2 rounded bg-brass-soft px-1.5 text-xs">demo</span>}
                    {p.archivedAt && <span className="ml-2 rounded bg-paper-deep px-1.5 text-xs">archived</span>}
                    {/* On narrow screens the other columns fold into lines under the name. */}
                    <div className="mt-1 space-y-2 md:hidden" data-testid="project-row-narrow">
                      <p className="text-ink-soft">{p.siteAddress} · {p.jurisdiction.name}</p>
                      <div className="flex flex-wrap gap-x-6 gap-y-2">
                        <CheckResult check={p.latestCheck} />
                        <Inspection inspection={p.inspection} />
                      </div>
                    </div>
                  </td>
                  <td className="hidden px-4 py-3 text-ink-soft md:table-cell">{p.siteAddress}</td>
                  <td className="hidden px-4 py-3 md:table-cell">{p.jurisdiction.name}</td>
                  <td className="hidden px-4 py-3 md:table-cell"><CheckResult check={p.latestCheck} /></td>
                  <td className="hidden px-4 py-3 md:table-cell"><Inspection inspection={p.inspection} /></td>
                  <td className="hidden px-4 py-3 text-ink-soft md:table-cell"><time dateTime={p.updatedAt}>{formatDate(p.updatedAt, p.jurisdiction.timeZone)}</time></td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      {data && data.total > data.pageSize && (
        <nav aria-label="Pages" className="flex items-center justify-between text-sm">
          <span className="text-ink-soft">{data.total} projects · page {data.page} of {pages}</span>
          <span className="flex gap-2">
            <button type="button" className="btn-secondary" disabled={page <= 1} onClick={() => setPage(page - 1)}>Previous</button>
            <button type="button" className="btn-secondary" disabled={page >= pages} onClick={() => setPage(page + 1)}>Next</button>
          </span>
        </nav>
      )}
    </div>
  );
}
