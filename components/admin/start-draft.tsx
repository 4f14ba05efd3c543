'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { fetchJson } from '@/lib/platform/client/fetch-json';

/** Starts the jurisdiction's draft: a full copy of the published version, or the model-code baseline for its editions. */
export function StartDraft({ slug, hasPublished }: { slug: string; hasPublished: boolean }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function start(from: 'published' | 'baseline') {
    setBusy(true);
    setError(null);
    try {
      const draft = await fetchJson<{ version: number }>(`/api/jurisdictions/${slug}/rule-sets`, { method: 'POST', json: { from } });
      router.push(`/rules/${slug}/versions/${draft.version}`);
    } catch (err) {
      setError((err as Error).message);
      setBusy(false);
    }
  }
  return (
    <div className="flex flex-wrap items-center gap-2">
      {hasPublished && <button type="button" className="btn-primary" disabled={busy} onClick={() => start('published')}>Start a draft from the published version</button>}
      <button type="button" className="btn-secondary" disabled={busy} onClick={() => start('baseline')}>Start from the model-code baseline</button>
      {error && <p role="alert" className="field-error w-full">{error}</p>}
    </div>
  );
}
