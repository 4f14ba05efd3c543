import type { SessionSummary } from '@/db/sessions';
import { SignOutOthers } from '@/components/account/sign-out-others';
import { DEFAULT_TIME_ZONE, formatDateTime } from '@/lib/domain/dates/format';

// An account belongs to no jurisdiction: its times are in UTC, labelled so.
const when = (d: Date) => formatDateTime(d, DEFAULT_TIME_ZONE);

/** The account's signed-in browsers, this one marked, with "sign out everywhere else". */
export function Sessions({ sessions, currentId }: { sessions: SessionSummary[]; currentId: string }) {
  const others = sessions.filter((s) => s.id !== currentId).length;
  return (
    <section aria-labelledby="sessions-heading" className="card p-6">
      <h2 id="sessions-heading" className="text-lg font-bold">Where you are signed in</h2>
      <p className="mt-1 text-sm text-ink-soft">
        Each sign-in lasts seven days at most, however active. Signing out ends it at once, on every copy of it.
      </p>
      <ul className="mt-4 divide-y divide-rule rounded-md border border-rule" data-testid="session-list">
        {sessions.map((s) => (
          <li key={s.id} className="px-4 py-3 text-sm">
            <div className="font-semibold">
              {s.id === currentId ? 'This browser' : 'Another browser'}
              {s.clientAddress && <span className="ml-2 font-mono text-xs font-normal text-ink-faint">{s.clientAddress}</span>}
            </div>
            {s.userAgent && <div className="truncate text-xs text-ink-faint" title={s.userAgent}>{s.userAgent}</div>}
            <div className="text-xs text-ink-soft">
              signed in {when(s.createdAt)} · last seen {when(s.lastSeenAt)} · ends {when(s.expiresAt)}
            </div>
          </li>
        ))}
      </ul>
      <SignOutOthers others={others} />
    </section>
  );
}
