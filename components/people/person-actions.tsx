'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

type Jurisdiction = { slug: string; name: string };

export type PersonRow = {
  id: string;
  name: string;
  email: string;
  role: 'installer' | 'inspector' | 'admin';
  isOwner: boolean;
  jurisdictionId: string | null;
  deactivatedAt: string | null;
};

/** The controls of one person's row: company role, jurisdiction (admins, inspectors only), deactivate or reactivate. */
export function PersonActions({ person, isSelf, jurisdictions }: { person: PersonRow; isSelf: boolean; jurisdictions?: (Jurisdiction & { id: string })[] }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const errorId = `person-${person.id}-error`;

  async function change(body: Record<string, unknown>) {
    setBusy(true);
    setError(null);
    try {
      await fetchJson(`/api/users/${person.id}`, { method: 'PATCH', json: body });
      router.refresh();
    } catch (err) {
      setError(err instanceof ApiError && err.errors.length ? err.errors[0].message : (err as Error).message);
    } finally {
      setBusy(false);
    }
  }

  const active = person.deactivatedAt === null;
  const describedBy = error ? errorId : undefined;
  return (
    <div className="flex flex-wrap items-center gap-2">
      {person.role === 'installer' && (
        <>
          <label htmlFor={`role-${person.id}`} className="sr-only">Company role of {person.name}</label>
          <select
            id={`role-${person.id}`}
            className="field-input w-auto py-1 text-xs"
            value={person.isOwner ? 'owner' : 'installer'}
            disabled={busy}
            aria-describedby={describedBy}
            onChange={(e) => change({ role: e.target.value })}
          >
            <option value="installer">Installer</option>
            <option value="owner">Owner</option>
          </select>
        </>
      )}
      {person.role === 'inspector' && jurisdictions && (
        <>
          <label htmlFor={`jurisdiction-${person.id}`} className="sr-only">Jurisdiction of {person.name}</label>
          <select
            id={`jurisdiction-${person.id}`}
            className="field-input w-auto py-1 text-xs"
            value={jurisdictions.find((j) => j.id === person.jurisdictionId)?.slug ?? ''}
            disabled={busy}
            aria-describedby={describedBy}
            onChange={(e) => change({ jurisdiction: e.target.value })}
          >
            {jurisdictions.map((j) => <option key={j.slug} value={j.slug}>{j.name}</option>)}
          </select>
        </>
      )}
      {!isSelf &&
        (active ? (
          <button type="button" className="btn-danger py-1 text-xs" disabled={busy} aria-describedby={describedBy} onClick={() => change({ active: false })} aria-label={`Deactivate ${person.name}`}>
            Deactivate
          </button>
        ) : (
          <button type="button" className="btn-secondary py-1 text-xs" disabled={busy} aria-describedby={describedBy} onClick={() => change({ active: true })} aria-label={`Reactivate ${person.name}`}>
            Reactivate
          </button>
        ))}
      {error && <p id={errorId} role="alert" className="field-error w-full">{error}</p>}
    </div>
  );
}
