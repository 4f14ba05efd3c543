'use client';

import { useRef, useState } from 'react';
import useSWR from 'swr';
import { ThumbnailState } from '@/components/attachments/thumbnail-state';
import { BusyButton } from '@/components/busy-button';
import { derivativesState, type AttachmentDerivatives } from '@/lib/domain/attachments/derivatives';
import { ApiError, fetchJson, swrFetcher } from '@/lib/platform/client/fetch-json';
import { MAX_PHOTO_SIDE_PX, preparePhoto, uploadWithProgress } from '@/lib/platform/client/photo-upload';

type A = { id: string; kind: 'photo' | 'document'; filename: string; caption: string; byteSize: number; createdAt: string; derivatives: AttachmentDerivatives };

const THUMBNAIL_POLL_MS = 2_000;
const THUMBNAIL_POLL_FOR_MS = 10 * 60_000;
const isWaiting = (a: A) => a.kind === 'photo' && ['pending', 'making', 'retrying'].includes(a.derivatives.status);

export function AttachmentsPanel({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  const url = `/api/projects/${projectId}/attachments`;
  // While a thumbnail is on its way the list is read again every few seconds (for ten minutes at most; a reload
  // shows the latest state); otherwise only on change. The clock restarts whenever nothing is waiting.
  const waitingSince = useRef<number | null>(null);
  const { data, error, isLoading, mutate } = useSWR<{ attachments: A[] }>(url, swrFetcher, {
    refreshInterval: (latest) => {
      if (!latest?.attachments.some(isWaiting)) {
        waitingSince.current = null;
        return 0;
      }
      waitingSince.current ??= Date.now();
      return Date.now() - waitingSince.current < THUMBNAIL_POLL_FOR_MS ? THUMBNAIL_POLL_MS : 0;
    },
  });
  const [againError, setAgainError] = useState<string | null>(null);
  const [caption, setCaption] = useState('');
  const [busy, setBusy] = useState(false);
  const [uploadError, setUploadError] = useState<string | null>(null);
  // null: nothing under way; 'preparing': the photo is being scaled; a number: the share sent so far.
  const [progress, setProgress] = useState<'preparing' | number | null>(null);
  const [note, setNote] = useState<string | null>(null);
  const fileRef = useRef<HTMLInputElement>(null);

  async function upload(e: React.FormEvent) {
    e.preventDefault();
    const file = fileRef.current?.files?.[0];
    if (!file) return setUploadError('Choose a file to upload.');
    setBusy(true);
    setUploadError(null);
    setNote(null);
    setProgress('preparing');
    try {
      const prepared = await preparePhoto(file);
      const form = new FormData();
      form.set('file', prepared.file);
      form.set('caption', caption);
      setProgress(0);
      await uploadWithProgress(url, form, setProgress);
      const s = prepared.scaledFrom;
      setNote(s ? `Uploaded ${prepared.file.name}, scaled from ${s.width} × ${s.height} to ${s.toWidth} × ${s.toHeight} px.` : `Uploaded ${prepared.file.name}.`);
      setCaption('');
      if (fileRef.current) fileRef.current.value = '';
      await mutate();
    } catch (err) {
      setUploadError(`${(err as Error).message} The file was not saved; choose it again to retry.`);
    } finally {
      setBusy(false);
      setProgress(null);
    }
  }

  async function saveCaption(id: string, value: string) {
    await fetchJson(`/api/attachments/${id}`, { method: 'PATCH', json: { caption: value } });
    await mutate();
  }

  async function makeAgain(a: A) {
    setAgainError(null);
    try {
      await fetchJson(`/api/attachments/${a.id}/derivatives`, { method: 'POST' });
    } catch (err) {
      setAgainError(err instanceof ApiError ? err.message : 'The thumbnail could not be queued again; try again in a moment.');
    }
    await mutate();
  }

  async function remove(a: A) {
    if (!window.confirm(`Delete ${a.filename}? Reports already issued keep their copy.`)) return;
    await fetchJson(`/api/attachments/${a.id}`, { method: 'DELETE' });
    await mutate();
  }

  return (
    <section className="card p-5" aria-labelledby="att-h">
      <h2 id="att-h" className="text-lg font-bold">Photos and documents</h2>
      <p className="mt-1 text-sm text-ink-soft">Appliance nameplates, the maker’s clearance page, the duct termination, the permit. Photos go into the next report.</p>
      {canEdit && (
        <form onSubmit={upload} className="mt-4 flex flex-wrap items-end gap-3" noValidate>
          <div>
            <label htmlFor="att-file" className="field-label">File (JPEG, PNG, WebP or PDF, up to 15 MB)</label>
            <input id="att-file" ref={fileRef} type="file" accept="image/jpeg,image/png,image/webp,application/pdf" className="mt-1 block min-h-[44px] text-sm" aria-describedby={`att-file-hint${uploadError ? ' att-error' : ''}`} />
            <p id="att-file-hint" className="mt-1 text-xs text-ink-soft">Photos larger than {MAX_PHOTO_SIDE_PX.toLocaleString('en-US')} px on their longest side are scaled down to a JPEG before they are sent.</p>
          </div>
          <div className="min-w-[14rem] flex-1">
            <label htmlFor="att-caption" className="field-label">Caption</label>
            <input id="att-caption" className="field-input" value={caption} onChange={(e) => setCaption(e.target.value)} placeholder="e.g. dryer nameplate" />
          </div>
          <button type="submit" className="btn-primary" disabled={busy}>{busy ? 'Uploading…' : 'Upload'}</button>
          {progress !== null && (
            <div className="w-full" role="status" data-testid="upload-progress">
              <label htmlFor="att-progress" className="text-sm text-ink-soft">
                {progress === 'preparing' ? 'Preparing the photo…' : `Uploading: ${Math.round(progress * 100)} %`}
              </label>
              <progress id="att-progress" className="mt-1 block h-2 w-full" max={1} value={progress === 'preparing' ? undefined : progress} />
            </div>
          )}
          {note && progress === null && <p role="status" className="w-full text-sm text-ink-soft" data-testid="upload-note">{note}</p>}
          {uploadError && <p id="att-error" role="alert" className="field-error w-full">{uploadError}</p>}
        </form>
      )}
      {isLoading && <p className="mt-3 text-sm text-ink-soft">Loading files…</p>}
      {error && <p role="alert" className="mt-3 text-sm text-status-fail">Files could not be loaded: {(error as Error).message}</p>}
      {againError && <p role="alert" className="mt-3 text-sm text-status-fail">{againError}</p>}
      {data && data.attachments.length === 0 && <p className="mt-3 text-sm text-ink-faint">Nothing attached yet.</p>}
      {data && data.attachments.length > 0 && (
        <ul className="mt-4 grid gap-4 sm:grid-cols-2 lg:grid-cols-3" data-testid="attachments">
          {data.attachments.map((a) => (
            <li key={a.id} className="rounded-md border border-rule bg-white p-3 text-sm">
              {a.kind === 'photo' && a.derivatives.status !== 'ready' ? (
                <>
                  <ThumbnailState derivatives={a.derivatives} filename={a.filename} />
                  {canEdit && derivativesState(a.derivatives).canMakeAgain && (
                    <BusyButton className="btn-secondary mt-2 px-2 py-1 text-xs" busyText="Queuing…" onClick={() => makeAgain(a)} aria-label={`Make the thumbnail of ${a.filename} again`}>
                      Make again
                    </BusyButton>
                  )}
                </>
              ) : a.kind === 'photo' ? (
                // eslint-disable-next-line @next/next/no-img-element
                <img src={`/api/attachments/${a.id}?variant=thumb`} alt={a.caption || a.filename} className="aspect-[4/3] w-full rounded object-cover" />
              ) : (
                <a href={`/api/attachments/${a.id}`} className="block rounded bg-paper-deep p-6 text-center font-semibold underline">PDF · {a.filename}</a>
              )}
              <div className="mt-2 font-mono text-xs text-ink-faint">{a.filename} · {Math.ceil(a.byteSize / 1024)} KB</div>
              {canEdit ? (
                <input
                  aria-label={`Caption of ${a.filename}`}
                  defaultValue={a.caption}
                  className="field-input mt-1 py-1 text-sm"
                  onBlur={(e) => e.target.value !== a.caption && void saveCaption(a.id, e.target.value)}
                />
              ) : (
                <p className="mt-1">{a.caption}</p>
              )}
              {canEdit && <button type="button" className="btn-danger mt-2 px-2 py-1 text-xs" onClick={() => remove(a)} aria-label={`Delete ${a.filename}`}>Delete</button>}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
