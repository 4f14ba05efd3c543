'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { invitedRoleLabels, type InvitedRole } from '@/lib/domain/accounts/people';
import { fetchJson } from '@/lib/platform/client/fetch-json';
import { DEFAULT_TIME_ZONE, formatDate } from '@/lib/domain/dates/format';
import { MailDelivery } from '@/components/mail/mail-delivery';
import type { MailDeliveryProps } from '@/lib/domain/mail/outbox';

export type PendingInvitation = {
  id: string;
  email: string;
  role: InvitedRole;
  state: 'pending' | 'expired' | 'accepted' | 'revoked';
  jurisdictionName: string | null;
  invitedByEmail: string | null;
  createdAt: string;
  expiresAt: string;
  mail?: MailDeliveryProps | null;
};

// People pages serve a company or the whole service, not one jurisdiction: UTC, labelled so.
const day = (iso: string) => formatDate(iso, DEFAULT_TIME_ZONE);

export function PendingInvitations({ invitations }: { invitations: PendingInvitation[] }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);

  async function revoke(id: string) {
    setError(null);
    try {
      await fetchJson(`/api/invitations/${id}`, { method: 'DELETE' });
    } catch (err) {
      setError((err as Error).message);
    }
    router.refresh();
  }

  return (
    <section aria-labelledby="pending-heading" className="card p-6">
      <h2 id="pending-heading" className="text-lg font-bold">Pending invitations</h2>
      {error && <p role="alert" className="mt-2 text-sm text-status-fail">{error}</p>}
      {invitations.length === 0 ? (
        <p className="mt-2 text-sm text-ink-soft">No invitations waiting to be accepted.</p>
      ) : (
        <ul className="mt-3 divide-y divide-rule rounded-md border border-rule" data-testid="pending-invitations">
          {invitations.map((i) => (
            <li key={i.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3 text-sm">
              <div>
                <div className="font-mono text-xs font-semibold">{i.email}</div>
                <div className="text-xs text-ink-soft">
                  {invitedRoleLabels[i.role]}{i.jurisdictionName ? ` · ${i.jurisdictionName}` : ''} · sent {day(i.createdAt)}
                  {i.invitedByEmail ? ` by ${i.invitedByEmail}` : ''} ·{' '}
                  {i.state === 'expired' ? <strong className="text-status-fail">expired {day(i.expiresAt)}; send a new one</strong> : `expires ${day(i.expiresAt)}`}
                </div>
                {i.mail && (
                  <div className="mt-1 text-xs">
                    <MailDelivery initial={i.mail} label="Invitation e-mail" />
                  </div>
                )}
              </div>
              <button type="button" className="btn-danger" onClick={() => revoke(i.id)} aria-label={`Revoke the invitation to ${i.email}`}>
                Revoke
              </button>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
