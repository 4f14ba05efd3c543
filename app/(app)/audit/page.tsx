import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { getDb } from '@/db';
import { PageHeader } from '@/components/ui/page-header';
import { accountActionLabels, auditFilterSchema } from '@/lib/domain/accounts/people';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';
import { readAudit } from '@/lib/services/accounts/account-audit';
import { DEFAULT_TIME_ZONE, formatDateTime } from '@/lib/domain/dates/format';

export const metadata: Metadata = { title: 'Audit' };

type Search = Promise<Record<string, string | string[] | undefined>>;

const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);

/** What the row is about, in a few words: the e-mail it concerns and what changed. */
function summary(details: Record<string, unknown>): string {
  const parts: string[] = [];
  if (typeof details.email === 'string') parts.push(details.email);
  if (typeof details.role === 'string') parts.push(`as ${details.role}`);
  if (typeof details.from === 'string' && typeof details.to === 'string' && !('jurisdictionName' in details)) parts.push(`${details.from} → ${details.to}`);
  if (typeof details.jurisdictionName === 'string') parts.push(`to ${details.jurisdictionName}`);
  if (typeof details.sessionsEnded === 'number') parts.push(`${details.sessionsEnded} session(s) ended, ${details.tokensRevoked} token(s) revoked`);
  return parts.join(' · ');
}

export default async function AuditPage({ searchParams }: { searchParams: Search }) {
  const user = await requirePageUser(pageRoles['/audit'], '/audit');
  if (user.role === 'installer' && !user.isOwner) redirect('/forbidden?from=%2Faudit');
  const raw = await searchParams;
  const parsed = auditFilterSchema.safeParse({ action: first(raw.action), person: first(raw.person), from: first(raw.from), to: first(raw.to) });
  const filter = parsed.success ? parsed.data : auditFilterSchema.parse({});
  let problem = parsed.success ? null : `${parsed.error.issues[0]?.path.join('.')}: ${parsed.error.issues[0]?.message}`;
  let result: Awaited<ReturnType<typeof readAudit>> = { rows: [], actions: [] };
  try {
    result = await readAudit(getDb(), user, filter);
  } catch (err) {
    problem = (err as Error).message;
  }
  return (
    <>
      <PageHeader kicker={user.role === 'admin' ? 'Administration' : 'Your company'} title="Audit log" />
      <p className="mb-4 max-w-3xl text-sm text-ink-soft">
        {user.role === 'admin'
          ? 'Everything recorded across NookPass, newest first.'
          : 'Account events of your company’s people — invitations, sign-ins, role changes, deactivations — newest first.'}{' '}
        Dates are whole days in UTC, both ends included.
      </p>
      <form method="get" className="card mb-4 flex flex-wrap items-end gap-3 p-4" role="search" aria-label="Filter the audit log">
        <div>
          <label htmlFor="audit-action" className="field-label">Action</label>
          <select id="audit-action" name="action" defaultValue={filter.action ?? ''} className="field-input">
            <option value="">Any action</option>
            {result.actions.map((a) => <option key={a} value={a}>{accountActionLabels[a] ? `${accountActionLabels[a]} (${a})` : a}</option>)}
          </select>
        </div>
        <div className="min-w-[14rem] flex-1">
          <label htmlFor="audit-person" className="field-label">Person</label>
          <input id="audit-person" name="person" defaultValue={filter.person ?? ''} placeholder="name or e-mail" className="field-input" />
        </div>
        <div>
          <label htmlFor="audit-from" className="field-label">From</label>
          <input id="audit-from" name="from" type="date" defaultValue={filter.from ?? ''} className="field-input" />
        </div>
        <div>
          <label htmlFor="audit-to" className="field-label">To</label>
          <input id="audit-to" name="to" type="date" defaultValue={filter.to ?? ''} className="field-input" />
        </div>
        <button type="submit" className="btn-secondary">Filter</button>
        {problem && <p role="alert" className="field-error w-full">{problem}</p>}
      </form>
      {/* Focusable so a keyboard can scroll the table on a phone. */}
      <div className="card overflow-x-auto" tabIndex={0} role="region" aria-label="Account events">
        <table className="min-w-full text-sm" data-testid="audit-table">
          <caption className="sr-only">Audit entries</caption>
          <thead className="bg-paper-deep text-left text-xs uppercase tracking-wide text-ink-soft">
            <tr>
              <th scope="col" className="px-4 py-3">When (UTC)</th>
              <th scope="col" className="px-4 py-3">Action</th>
              <th scope="col" className="px-4 py-3">By</th>
              <th scope="col" className="px-4 py-3">About</th>
              {user.role === 'admin' && <th scope="col" className="px-4 py-3">Company</th>}
            </tr>
          </thead>
          <tbody className="divide-y divide-rule">
            {result.rows.map((r) => (
              <tr key={r.id} data-action={r.action}>
                <td className="whitespace-nowrap px-4 py-2 font-mono text-xs">{formatDateTime(r.at, DEFAULT_TIME_ZONE, { seconds: true })}</td>
                <td className="px-4 py-2">{accountActionLabels[r.action] ?? r.action}</td>
                <td className="px-4 py-2">{r.actorName ?? '—'}{r.actorEmail ? <span className="block font-mono text-xs text-ink-soft">{r.actorEmail}</span> : null}</td>
                <td className="px-4 py-2 text-xs">{summary(r.details)}</td>
                {user.role === 'admin' && <td className="px-4 py-2 text-xs">{r.organizationName ?? '—'}</td>}
              </tr>
            ))}
          </tbody>
        </table>
        {result.rows.length === 0 && <p className="px-4 py-6 text-sm text-ink-soft">No entries match.</p>}
      </div>
    </>
  );
}
