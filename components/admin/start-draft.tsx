'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { fetchJson } from '@/lib/platform/client/fetch-json';
import { BusyButton } from '@/components/busy-button';

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
      {hasPublished && <BusyButton className="btn-primary" busy={busy} busyText="Starting the draft…" onClick={() => start('published')}>Start a draft from the published version</BusyButton>}
      <BusyButton className="btn-secondary" busy={busy} busyText="Starting the draft…" onClick={() => start('baseline')}>Start from the model-code baseline</BusyButton>
      {error && <p role="alert" className="field-error w-full">{error}</p>}
    </div>
  );
}
