'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { fetchJson } from '@/lib/platform/client/fetch-json';

export function RunCheckButton({ projectId, label = 'Run check', className = 'btn-primary' }: { projectId: string; label?: string; className?: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <span className="inline-flex flex-col">
      <button
        type="button"
        className={className}
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setError(null);
          try {
            const check = await fetchJson<{ id: string }>(`/api/projects/${projectId}/checks`, { method: 'POST', json: {} });
            router.push(`/projects/${projectId}/checks/${check.id}`);
          } catch (err) {
            setError((err as Error).message);
            setBusy(false);
          }
        }}
      >
        {busy ? 'Running check…' : label}
      </button>
      {error && <span role="alert" className="field-error">{error}</span>}
    </span>
  );
}
