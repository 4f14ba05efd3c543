import Link from 'next/link';
import type { InspectionListItem } from '@/db/reports';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatDateTime } from '@/lib/domain/dates/format';


function Outcome({ r }: { r: InspectionListItem }) {
  if (r.reviewOutcome === 'approved') return <StatusBadge status="pass" label="Approved" />;
  if (r.reviewOutcome === 'corrections-needed') return <StatusBadge status="fail" label="Corrections needed" />;
  return <span className="text-ink-soft">Awaiting your outcome</span>;
}

/**
 * The queue. On a phone the received date, permit, installer and counts fold into the project cell, so the
 * table keeps two columns and needs no sideways scrolling at 390 px.
 */
export function InspectionsTable({ rows }: { rows: InspectionListItem[] }) {
  return (
    <div className="card overflow-x-auto">
      <table className="w-full text-sm" data-testid="inspections-table">
        <caption className="sr-only">Reports sent to your jurisdiction, newest first</caption>
        <thead className="bg-paper-deep text-left text-xs uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="hidden px-4 py-3 md:table-cell">Received</th>
            <th scope="col" className="px-4 py-3">Project and site address</th>
            <th scope="col" className="hidden px-4 py-3 md:table-cell">Permit</th>
            <th scope="col" className="hidden px-4 py-3 lg:table-cell">Installer</th>
            <th scope="col" className="hidden px-4 py-3 lg:table-cell">Check</th>
            <th scope="col" className="px-4 py-3">Your outcome</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {rows.map((r) => (
            <tr key={r.reportId} data-testid="inspection-row" data-code={r.code}>
              <td className="hidden whitespace-nowrap px-4 py-3 align-top md:table-cell">
                {formatDateTime(r.sentAt, r.timeZone)}
              </td>
              <td className="px-4 py-3 align-top">
                <Link href={`/inspections/${r.reportId}`} className="font-semibold underline underline-offset-2">{r.projectName}</Link>
                <div data-testid="site-address">{r.siteAddress}</div>
                <div className="font-mono text-xs text-ink-soft">report {r.code}</div>
                <div className="mt-1 space-y-0.5 text-xs text-ink-soft md:hidden">
                  <div>Received {formatDateTime(r.sentAt, r.timeZone)}</div>
                  <div>Permit {r.permitNumber ?? 'not given'}</div>
                  <div className="lg:hidden">{r.organizationName} · {r.summary.fail} fail · {r.summary.caution} caution · {r.summary.needsInfo} info</div>
                </div>
                <div className="mt-1 hidden text-xs text-ink-soft md:block lg:hidden">{r.organizationName} · {r.summary.fail} fail · {r.summary.caution} caution · {r.summary.needsInfo} info</div>
                {!r.asIssued && <div className="mt-1 text-xs text-ink-soft">Issued before reports kept their details: shown as the project is today.</div>}
              </td>
              <td className="hidden px-4 py-3 align-top md:table-cell" data-testid="permit">{r.permitNumber ?? <span className="text-ink-soft">not given</span>}</td>
              <td className="hidden px-4 py-3 align-top lg:table-cell">{r.organizationName}</td>
              <td className="hidden whitespace-nowrap px-4 py-3 align-top font-mono text-xs lg:table-cell">{r.summary.fail} fail · {r.summary.caution} caution · {r.summary.needsInfo} info</td>
              <td className="px-4 py-3 align-top"><Outcome r={r} /></td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
