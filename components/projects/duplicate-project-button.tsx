'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import type { FieldError } from '@/lib/domain/errors';
import { copyName } from '@/lib/domain/projects/duplicate';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

/** A new job from this closet: a project of its own whose first plan revision is a copy of one of this project's. */
export function DuplicateProjectButton({ projectId, name, siteAddress, revisions }: { projectId: string; name: string; siteAddress: string; revisions: number[] }) {
  const router = useRouter();
  const [values, setValues] = useState({ name: copyName(name), siteAddress, revision: String(revisions[0] ?? '') });
  const [errors, setErrors] = useState<FieldError[]>([]);
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setErrors([]);
    setMessage(null);
    try {
      const copy = await fetchJson<{ id: string }>(`/api/projects/${projectId}/duplicate`, {
        method: 'POST',
        json: { name: values.name, siteAddress: values.siteAddress, ...(values.revision ? { revision: Number(values.revision) } : {}) },
      });
      router.push(`/projects/${copy.id}/plan`);
    } catch (err) {
      if (err instanceof ApiError) setErrors(err.errors);
      setMessage(`Not copied: ${(err as Error).message}`);
      setBusy(false);
    }
  }

  const err = (path: string) => errors.find((x) => x.path === path)?.message;
  if (revisions.length === 0) return null;
  return (
    <details className="mt-3" data-testid="duplicate-project">
      <summary className="cursor-pointer underline">New job from this closet</summary>
      <form onSubmit={submit} noValidate className="mt-2 space-y-2">
        {(['name', 'siteAddress'] as const).map((key) => (
          <div key={key}>
            <label htmlFor={`dup-${key}`} className="field-label">{key === 'name' ? 'New project name' : 'Site address'}</label>
            <input id={`dup-${key}`} className="field-input" value={values[key]} onChange={(e) => setValues({ ...values, [key]: e.target.value })}
              aria-invalid={err(key) ? true : undefined} aria-describedby={err(key) ? `dup-${key}-error` : undefined} />
            {err(key) && <p id={`dup-${key}-error`} className="field-error" role="alert">{err(key)}</p>}
          </div>
        ))}
        <div>
          <label htmlFor="dup-revision" className="field-label">Plan to copy</label>
          <select id="dup-revision" className="field-input" value={values.revision} onChange={(e) => setValues({ ...values, revision: e.target.value })}>
            {revisions.map((n, i) => <option key={n} value={n}>Revision {n}{i === 0 ? ' (latest)' : ''}</option>)}
          </select>
        </div>
        <button type="submit" className="btn-secondary" disabled={busy}>{busy ? 'Copying…' : 'Copy into a new project'}</button>
        {message && <p role="alert" className="text-sm text-status-fail">{message}</p>}
      </form>
    </details>
  );
}
