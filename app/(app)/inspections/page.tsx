import type { Metadata } from 'next';
import Link from 'next/link';
import { getDb } from '@/db';
import { findJurisdictionById } from '@/db/jurisdictions';
import { listInspections } from '@/db/reports';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { StatusBadge } from '@/components/ui/status-badge';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';

export const metadata: Metadata = { title: 'Inspections' };

export default async function InspectionsPage() {
  const user = await requirePageUser(pageRoles['/inspections'], '/inspections');
  const db = getDb();
  const jurisdiction = user.jurisdictionId
    ? await findJurisdictionById(db, user.jurisdictionId)
    : null;
  const rows = await listInspections(db, user.role === 'inspector' ? user.jurisdictionId : null);
  return (
    <>
      <PageHeader kicker={jurisdiction ? jurisdiction.name : 'All jurisdictions'} title="Inspections" />
      {rows.length === 0 ? (
        <EmptyState title="No reports have been sent to you yet">
          <p>
            When an installer sends a check report for a job in your jurisdiction it appears here. You can confirm a
            paper copy is genuine, go through its findings and record an outcome — approved or corrections needed —
            which goes back to the installer.
          </p>
        </EmptyState>
      ) : (
        <div className="card overflow-x-auto">
          <table className="min-w-full text-sm">
            <caption className="sr-only">Reports sent to your jurisdiction</caption>
            <thead className="bg-paper-deep text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr><th className="px-4 py-3">Received</th><th className="px-4 py-3">Project</th><th className="px-4 py-3">Installer</th><th className="px-4 py-3">Check</th><th className="px-4 py-3">Your outcome</th></tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {rows.map((r) => (
                <tr key={r.reportId}>
                  <td className="px-4 py-3">{r.sentAt.toLocaleString()}</td>
                  <td className="px-4 py-3">
                    <Link href={`/inspections/${r.reportId}`} className="font-semibold underline-offset-2 hover:underline">{r.projectName}</Link>
                    <div className="text-xs text-ink-faint">
                      {r.siteAddress} · report {r.code}
                      {!r.asIssued && ' · issued before reports kept their details; shown as today'}
                    </div>
                  </td>
                  <td className="px-4 py-3">{r.organizationName}</td>
                  <td className="px-4 py-3 font-mono text-xs">{r.summary.fail} fail · {r.summary.caution} caution · {r.summary.needsInfo} info</td>
                  <td className="px-4 py-3">
                    {r.reviewOutcome === 'approved' ? <StatusBadge status="pass" label="Approved" /> : r.reviewOutcome === 'corrections-needed' ? <StatusBadge status="fail" label="Corrections needed" /> : <span className="text-ink-faint">Not reviewed</span>}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
