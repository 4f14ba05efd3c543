'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { applianceFields, applianceKindLabels, type ApplianceField, type ApplianceModel } from '@/lib/domain/appliances/model';
import type { FieldError } from '@/lib/domain/errors';
import { formatArea, formatLength } from '@/lib/domain/units';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

const fields = applianceFields as readonly ApplianceField[];
type Draft = Record<string, string>;

const emptyDraft = (): Draft => Object.fromEntries(fields.map((f) => [f.key, f.key === 'kind' ? 'washer' : '']));

function toDraft(m: ApplianceModel): Draft {
  return Object.fromEntries(fields.map((f) => [f.key, (m as unknown as Record<string, unknown>)[f.key] == null ? '' : String((m as unknown as Record<string, unknown>)[f.key])]));
}

/** The form's text as the API's JSON: numbers stay numbers, sizes may carry units, blanks are not given (null when editing). */
function fromDraft(d: Draft, editing: boolean): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const f of fields) {
    const text = (d[f.key] ?? '').trim();
    if (text === '') {
      if (editing && !f.required) out[f.key] = null;
      continue;
    }
    if (f.kind === 'number' || f.kind === 'integer') out[f.key] = Number.isFinite(Number(text)) ? Number(text) : text;
    else if (f.kind === 'length' || f.kind === 'area') out[f.key] = /^\d+(\.\d+)?$/.test(text) ? Number(text) : text;
    else out[f.key] = text;
  }
  return out;
}

const L = (v: number | null) => (v === null ? '—' : formatLength(v, 'imperial', 'inches'));

export function ApplianceLibrary({ initialModels }: { initialModels: ApplianceModel[] }) {
  const router = useRouter();
  const [models, setModels] = useState(initialModels);
  const [draft, setDraft] = useState<Draft>(emptyDraft);
  const [editing, setEditing] = useState<string | null>(null);
  const [errors, setErrors] = useState<FieldError[]>([]);
  const [status, setStatus] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const [importErrors, setImportErrors] = useState<FieldError[]>([]);

  async function reload() {
    const res = await fetchJson<{ items: ApplianceModel[] }>('/api/appliances');
    setModels(res.items);
    router.refresh();
  }

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setErrors([]);
    setStatus(null);
    try {
      const body = fromDraft(draft, editing !== null);
      const saved = editing
        ? await fetchJson<ApplianceModel>(`/api/appliances/${editing}`, { method: 'PATCH', json: body })
        : await fetchJson<ApplianceModel>('/api/appliances', { method: 'POST', json: body });
      setStatus({ kind: 'ok', text: `${editing ? 'Saved' : 'Added'} ${saved.label}.` });
      setDraft(emptyDraft());
      setEditing(null);
      await reload();
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) setErrors(err.errors);
      setStatus({ kind: 'error', text: `Not saved: ${(err as Error).message} Your entries are still here.` });
    }
  }

  async function remove(m: ApplianceModel) {
    if (!window.confirm(`Delete ${m.label} from the library? Plans filled from it keep their figures.`)) return;
    try {
      await fetchJson(`/api/appliances/${m.id}`, { method: 'DELETE' });
      setStatus({ kind: 'ok', text: `Deleted ${m.label}.` });
      await reload();
    } catch (err) {
      setStatus({ kind: 'error', text: `Not deleted: ${(err as Error).message}` });
    }
  }

  async function importFile(file: File) {
    setImportErrors([]);
    setStatus(null);
    try {
      const res = await fetchJson<{ created: number; updated: number }>('/api/appliances/csv', {
        method: 'POST',
        headers: { 'content-type': 'text/csv' },
        body: await file.text(),
      });
      setStatus({ kind: 'ok', text: `Imported ${file.name}: ${res.created} added, ${res.updated} replaced.` });
      await reload();
    } catch (err) {
      if (err instanceof ApiError) setImportErrors(err.errors);
      setStatus({ kind: 'error', text: `Nothing of ${file.name} was imported: ${(err as Error).message}` });
    }
  }

  const errorFor = (key: string) => errors.find((e) => e.path === key)?.message;

  return (
    <div className="mt-5 space-y-6">
      {status && (
        <p role={status.kind === 'error' ? 'alert' : 'status'} className={`text-sm font-semibold ${status.kind === 'error' ? 'text-status-fail' : 'text-status-pass'}`} data-testid="library-status">
          {status.text}
        </p>
      )}

      <div className="card overflow-x-auto p-0">
        <table className="w-full text-sm" data-testid="appliance-table">
          <caption className="sr-only">Appliance models</caption>
          <thead className="bg-paper-deep text-left">
            <tr>
              <th scope="col" className="p-2">Model</th>
              <th scope="col" className="p-2">Kind</th>
              <th scope="col" className="p-2">W × D × H</th>
              <th scope="col" className="p-2">Clearances side / top / rear / front</th>
              <th scope="col" className="p-2">Dryer</th>
              <th scope="col" className="p-2">Rating</th>
              <th scope="col" className="p-2"><span className="sr-only">Actions</span></th>
            </tr>
          </thead>
          <tbody>
            {models.length === 0 && (
              <tr><td colSpan={7} className="p-3 text-ink-faint">No models yet: add one below or import a CSV file.</td></tr>
            )}
            {models.map((m) => (
              <tr key={m.id} className="border-t border-rule">
                <th scope="row" className="p-2 text-left font-semibold">{m.label}{m.isDemo && <span className="ml-2 rounded bg-paper-deep px-1 text-xs">demo</span>}</th>
                <td className="p-2">{applianceKindLabels[m.kind]}</td>
                <td className="p-2 whitespace-nowrap">{L(m.widthIn)} × {L(m.depthIn)} × {L(m.heightIn)}</td>
                <td className="p-2 whitespace-nowrap">{[m.clearanceSideIn, m.clearanceTopIn, m.clearanceRearIn, m.clearanceFrontIn].map(L).join(' / ')}</td>
                <td className="p-2">
                  {m.kind === 'washer' ? '—' : [m.fuel, m.dryerType, m.exhaustCfm !== null ? `${m.exhaustCfm} cfm` : null,
                    m.maxExhaustLengthIn !== null ? `max ${formatLength(m.maxExhaustLengthIn, 'imperial')}` : null,
                    m.closetVentTopSqIn !== null || m.closetVentBottomSqIn !== null ? `vent ${m.closetVentTopSqIn !== null ? formatArea(m.closetVentTopSqIn, 'imperial') : '—'} top, ${m.closetVentBottomSqIn !== null ? formatArea(m.closetVentBottomSqIn, 'imperial') : '—'} bottom` : null,
                  ].filter(Boolean).join(', ')}
                </td>
                <td className="p-2 whitespace-nowrap">{m.volts !== null ? `${m.volts} V` : '—'}{m.amps !== null ? ` ${m.amps} A` : ''}</td>
                <td className="p-2 whitespace-nowrap">
                  <button type="button" className="btn-secondary px-2 py-1 text-xs" onClick={() => { setEditing(m.id); setDraft(toDraft(m)); setErrors([]); }}>Edit<span className="sr-only"> {m.label}</span></button>{' '}
                  <button type="button" className="btn-danger px-2 py-1 text-xs" onClick={() => remove(m)}>Delete<span className="sr-only"> {m.label}</span></button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      <form onSubmit={save} noValidate className="card p-5" aria-labelledby="model-form-title">
        <h2 id="model-form-title" className="text-lg font-bold">{editing ? 'Edit model' : 'Add a model'}</h2>
        <div className="mt-3 grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          {fields.map((f) => {
            const id = `model-${f.key}`;
            const error = errorFor(f.key);
            const common = {
              id,
              name: f.key,
              value: draft[f.key] ?? '',
              'aria-invalid': error ? true : undefined,
              'aria-describedby': error ? `${id}-error` : undefined,
              onChange: (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) => setDraft({ ...draft, [f.key]: e.target.value }),
            };
            return (
              <div key={f.key}>
                <label htmlFor={id} className="field-label">{f.label}{f.required ? '' : ' (optional)'}</label>
                {f.kind === 'choice' ? (
                  <select {...common} className="field-input">
                    {!f.required && <option value="">— not given</option>}
                    {f.choices!.map((c) => <option key={c} value={c}>{f.key === 'kind' ? applianceKindLabels[c as keyof typeof applianceKindLabels] : c}</option>)}
                  </select>
                ) : (
                  <input {...common} type="text" inputMode={f.kind === 'text' ? 'text' : 'decimal'} autoComplete="off" className="field-input" />
                )}
                <p className="mt-1 text-xs text-ink-faint">{f.help}</p>
                {error && <p id={`${id}-error`} className="field-error" role="alert">{error}</p>}
              </div>
            );
          })}
        </div>
        <div className="mt-4 flex gap-3">
          <button type="submit" className="btn-primary">{editing ? 'Save model' : 'Add model'}</button>
          {editing && <button type="button" className="btn-secondary" onClick={() => { setEditing(null); setDraft(emptyDraft()); setErrors([]); }}>Cancel</button>}
        </div>
      </form>

      <section className="card p-5" aria-labelledby="csv-title">
        <h2 id="csv-title" className="text-lg font-bold">Import and export</h2>
        <div className="mt-3 flex flex-wrap items-end gap-4">
          <div>
            <label htmlFor="csv-file" className="field-label">Import a CSV file</label>
            <input id="csv-file" type="file" accept=".csv,text/csv" className="mt-1 block text-sm"
              onChange={(e) => { const f = e.target.files?.[0]; if (f) void importFile(f); e.target.value = ''; }} />
          </div>
          <a className="btn-secondary" href="/api/appliances/csv" download>Export as CSV</a>
        </div>
        {importErrors.length > 0 && (
          <ul className="mt-3 list-disc space-y-1 pl-5 text-sm text-status-fail" data-testid="import-errors">
            {importErrors.map((e, i) => <li key={i}>{e.message}</li>)}
          </ul>
        )}
      </section>
    </div>
  );
}
