'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { createContext, useContext, useMemo, useState } from 'react';
import { useFieldArray, useForm, useWatch, type Control, type FieldErrors, type UseFormRegister } from 'react-hook-form';
import { fieldsOf, readPath, type FormField } from '@/lib/domain/rule-sets/form-schema';
import { ApiError } from '@/lib/platform/client/fetch-json';
import { ruleSetParametersSchema, type RuleSetParameters } from '@/lib/domain/params';
import { formatLength } from '@/lib/domain/units';
import { defaultParameters } from '@/lib/domain/params/defaults';
import { parameterValueText } from '@/lib/domain/params/describe';
import { hingeChartColumns, parameterGroupLabels, parameterInputUnit, parameterLabel, describeParameter, PARAMETER_DECIMALS, sameParameterValue } from '@/lib/domain/params/describe';
import { BusyButton } from '@/components/busy-button';

type Amending = { model: RuleSetParameters | null; citations: Record<string, string>; setCitation: (path: string, text: string) => void; readOnly: boolean };
const AmendingContext = createContext<Amending>({ model: null, citations: {}, setCitation: () => {}, readOnly: true });

function modelFor(parameters: RuleSetParameters): RuleSetParameters | null {
  try {
    return defaultParameters(parameters.editions);
  } catch {
    return null;
  }
}

/**
 * Shown under a parameter once it differs from the model code's value for the adopted editions: the
 * local amendment that makes the change must be cited before the draft saves.
 */
function AmendmentCitation({ control, path }: { control: Control<Values>; path: string }) {
  const { model, citations, setCitation, readOnly } = useContext(AmendingContext);
  const value = useWatch({ control, name: path });
  if (!model) return null;
  const modelValue = readPath(model, path);
  if (modelValue === undefined || sameParameterValue(value, modelValue)) return null;
  const id = `${idFor(path)}-amendment`;
  return (
    <div className="mt-1 rounded-md bg-paper-deep px-2 py-1" data-testid={`amendment-${path}`}>
      <label htmlFor={id} className="block text-xs text-ink-soft">
        Changed from the model value {parameterValueText(path, modelValue)}: local amendment (ordinance or amendment section)
      </label>
      <input id={id} className="field-input max-w-md" value={citations[path] ?? ''} disabled={readOnly} maxLength={200} onChange={(e) => setCitation(path, e.target.value)} placeholder="e.g. Ord. 12-34 §2" />
    </div>
  );
}

const isPlainObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Figures as the form shows them: a converted 1000 mm reads 39.3701, not 39.3700787402. */
function shownFigures(value: unknown): unknown {
  if (typeof value === 'number') return Number(value.toFixed(PARAMETER_DECIMALS));
  if (Array.isArray(value)) return value.map(shownFigures);
  if (isPlainObject(value)) return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, shownFigures(v)]));
  return value;
}

/** Back to the stored figures wherever the admin left a value as shown, so saving changes nothing unasked. */
function withStoredFigures(value: unknown, stored: unknown): unknown {
  if (typeof value === 'number' && typeof stored === 'number') return sameParameterValue(value, stored) ? stored : value;
  if (Array.isArray(value)) return value.map((v, i) => withStoredFigures(v, Array.isArray(stored) ? stored[i] : undefined));
  if (isPlainObject(value)) return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, withStoredFigures(v, isPlainObject(stored) ? stored[k] : undefined)]));
  return value;
}

// Generated once from the zod schema: a parameter added there appears here with its description as label.
const FIELDS = fieldsOf(ruleSetParametersSchema);

type Values = Record<string, unknown>;

const idFor = (path: string) => `p-${path.replace(/\./g, '-')}`;

function errorAt(errors: FieldErrors<Values>, path: string): string | undefined {
  const node = path.split('.').reduce<unknown>((acc, k) => (acc as Record<string, unknown> | undefined)?.[k], errors) as { message?: string } | undefined;
  return typeof node?.message === 'string' ? node.message : undefined;
}

const toNumber = (nullable: boolean) => (v: unknown) => {
  if (typeof v === 'number') return v;
  const text = String(v ?? '').trim();
  if (text === '') return nullable ? null : undefined;
  return Number(text);
};

function LengthHint({ control, path }: { control: Control<Values>; path: string }) {
  const value = useWatch({ control, name: path });
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 12) return null;
  return <span className="ml-2 font-mono text-xs text-ink-faint" data-testid={`hint-${path}`}>= {formatLength(value, 'imperial')}</span>;
}

function Leaf({ field, path, register, errors, control, readOnly }: { field: Exclude<FormField, { kind: 'group' | 'rows' }>; path: string; register: UseFormRegister<Values>; errors: FieldErrors<Values>; control: Control<Values>; readOnly: boolean }) {
  const id = idFor(path);
  const message = errorAt(errors, path);
  const aria = { id, 'aria-invalid': message ? true : undefined, 'aria-describedby': message ? `${id}-error` : undefined, disabled: readOnly };
  let input: React.ReactNode;
  if (field.kind === 'number') {
    input = (
      <div className="flex items-center">
        <input type="number" step="any" inputMode="decimal" min={field.min ?? undefined} className="field-input max-w-[10rem]" {...aria} {...register(path, { setValueAs: toNumber(field.nullable) })} />
        {parameterInputUnit(path) && <span className="ml-2 text-sm text-ink-soft">{parameterInputUnit(path)}</span>}
        {describeParameter(path)?.unit === 'length' && <LengthHint control={control} path={path} />}
      </div>
    );
  } else if (field.kind === 'boolean') {
    input = <input type="checkbox" className="mt-2 h-5 w-5" {...aria} {...register(path)} />;
  } else if (field.kind === 'enum') {
    input = (
      <select className="field-input max-w-md" {...aria} {...register(path)}>
        {field.options.map((o) => <option key={o} value={o}>{describeParameter(path)?.choices?.[o] ?? o}</option>)}
      </select>
    );
  } else {
    input = <input className="field-input max-w-md" {...aria} {...register(path, field.nullable ? { setValueAs: (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v) } : {})} />;
  }
  return (
    <div>
      <label htmlFor={id} className="field-label font-normal">
        {parameterLabel(path)}
        {field.kind !== 'boolean' && 'nullable' in field && field.nullable && <span className="text-ink-faint"> (leave empty: not set)</span>}
      </label>
      {input}
      {message && <p id={`${id}-error`} role="alert" className="field-error">{message}</p>}
      {!path.startsWith('editions.') && !/Section$/.test(path) && <AmendmentCitation control={control} path={path} />}
    </div>
  );
}

function Rows({ field, control, register, errors, readOnly }: { field: Extract<FormField, { kind: 'rows' }>; control: Control<Values>; register: UseFormRegister<Values>; errors: FieldErrors<Values>; readOnly: boolean }) {
  const { fields, append, remove } = useFieldArray({ control, name: field.path as never });
  const message = errorAt(errors, field.path);
  return (
    <fieldset className="rounded-md border border-rule p-3">
      <legend className="px-1 text-sm font-semibold">{parameterLabel(field.path)}</legend>
      <table className="text-sm">
        <thead><tr>{field.row.map((c) => <th key={c.path} scope="col" className="pr-3 text-left font-normal text-ink-soft">{hingeChartColumns[c.path]?.label ?? c.label}{hingeChartColumns[c.path]?.unit === 'length' ? ' (in)' : ''}</th>)}<th /></tr></thead>
        <tbody>
          {fields.map((row, i) => (
            <tr key={row.id}>
              {field.row.map((c) => {
                const path = `${field.path}.${i}.${c.path}`;
                const cellError = errorAt(errors, path);
                return (
                  <td key={c.path} className="pr-3 align-top">
                    <input type="number" step="any" aria-label={`${hingeChartColumns[c.path]?.label ?? c.label}, row ${i + 1}`} id={idFor(path)} disabled={readOnly} className="field-input w-28" aria-invalid={cellError ? true : undefined} {...register(path, { setValueAs: toNumber(false) })} />
                    {cellError && <p role="alert" className="field-error">{cellError}</p>}
                  </td>
                );
              })}
              <td>{!readOnly && <button type="button" className="btn-secondary px-2 py-1" onClick={() => remove(i)} aria-label={`Remove row ${i + 1}`}>Remove</button>}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {!readOnly && <button type="button" className="btn-secondary mt-2 px-2 py-1" onClick={() => append(Object.fromEntries(field.row.map((c) => [c.path, 0])) as never)}>Add row</button>}
      {message && <p role="alert" className="field-error">{message}</p>}
      <AmendmentCitation control={control} path={field.path} />
    </fieldset>
  );
}

function Group({ fields, columns = false, ...rest }: { fields: FormField[]; columns?: boolean; values: unknown; control: Control<Values>; register: UseFormRegister<Values>; errors: FieldErrors<Values>; readOnly: boolean }) {
  return (
    <div className={columns ? 'grid gap-4 md:grid-cols-2' : 'space-y-4'}>
      {fields.map((f) => {
        if (f.kind === 'group' && f.path === 'editions') {
          // Shown, not edited: the editions belong to the jurisdiction and stay in the form's values as loaded.
          return (
            <fieldset key={f.path} className="space-y-2 border-t border-rule pt-4">
              <legend className="text-base font-bold">{parameterGroupLabels[f.path] ?? f.label}</legend>
              <p className="text-xs text-ink-faint">From the jurisdiction. To change them, edit the jurisdiction and start a draft from the baseline.</p>
              <dl className="grid grid-cols-2 gap-x-4 text-sm sm:grid-cols-3">
                {f.children.map((c) => (
                  <div key={c.path}><dt className="text-ink-faint">{parameterLabel(c.path)}</dt><dd data-testid={`edition-${c.path}`}>{String(readPath(rest.values, c.path) ?? '')}</dd></div>
                ))}
              </dl>
            </fieldset>
          );
        }
        // Entered beside each changed parameter instead (AmendmentCitation).
        if (f.path === 'amendments') return null;
        if (f.kind === 'group') {
          return (
            <fieldset key={f.path} className="space-y-3 border-t border-rule pt-4 md:col-span-2">
              <legend className="text-base font-bold">{parameterGroupLabels[f.path] ?? f.label}</legend>
              <Group fields={f.children} columns {...rest} />
            </fieldset>
          );
        }
        if (f.kind === 'rows') return <div key={f.path} className="md:col-span-2"><Rows field={f} control={rest.control} register={rest.register} errors={rest.errors} readOnly={rest.readOnly} /></div>;
        return <Leaf key={f.path} field={f} path={f.path} control={rest.control} register={rest.register} errors={rest.errors} readOnly={rest.readOnly} />;
      })}
    </div>
  );
}

/**
 * The rule set parameters, as a form generated from ruleSetParametersSchema; the route handler
 * parses the same schema. Read-only for published and retired versions.
 */
export function ParametersForm({ parameters, readOnly = false, onSave }: { parameters: RuleSetParameters; readOnly?: boolean; onSave?: (parameters: RuleSetParameters) => Promise<void> }) {
  const [status, setStatus] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const model = useMemo(() => modelFor(parameters), [parameters]);
  const [citations, setCitations] = useState<Record<string, string>>(() => Object.fromEntries((parameters.amendments ?? []).map((a) => [a.parameter, a.citation])));
  const amending = useMemo<Amending>(() => ({ model, citations, readOnly, setCitation: (path, text) => setCitations((c) => ({ ...c, [path]: text })) }), [model, citations, readOnly]);
  const { register, control, handleSubmit, setError, formState: { errors, isSubmitting, isDirty }, reset } = useForm<Values>({
    resolver: zodResolver(ruleSetParametersSchema as never),
    defaultValues: shownFigures(parameters) as Values,
  });

  async function submit(values: Values) {
    if (!onSave) return;
    setStatus(null);
    try {
      // Only the citations of values still changed are kept: a value set back to the model needs none.
      const amendments = Object.entries(citations)
        .filter(([path, text]) => text.trim() !== '' && model && !sameParameterValue(readPath(values, path), readPath(model, path)))
        .map(([parameter, citation]) => ({ parameter, citation: citation.trim() }));
      await onSave({ ...(withStoredFigures(values, parameters) as RuleSetParameters), amendments });
      reset(values);
      setStatus({ kind: 'ok', text: 'Parameters saved to the draft.' });
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        for (const e of err.errors) setError(e.path.replace(/^parameters\./, '') as never, { message: e.message });
        setStatus({ kind: 'error', text: 'Some parameters need attention; nothing was saved.' });
      } else setStatus({ kind: 'error', text: (err as Error).message });
    }
  }

  return (
    <form onSubmit={handleSubmit(submit, () => setStatus({ kind: 'error', text: 'Some parameters need attention; nothing was saved.' }))} noValidate aria-label="Rule set parameters">
      <AmendingContext.Provider value={amending}>
        <Group fields={FIELDS} values={parameters} control={control} register={register} errors={errors} readOnly={readOnly} />
      </AmendingContext.Provider>
      {!readOnly && (
        <div className="sticky bottom-0 mt-4 flex flex-wrap items-center gap-3 border-t border-rule bg-white py-3">
          <BusyButton type="submit" className="btn-primary" busy={isSubmitting} busyText="Saving parameters…">Save parameters</BusyButton>
          <span className="text-sm text-ink-soft" data-testid="parameters-state">{isDirty ? 'Unsaved changes' : 'No unsaved changes'}</span>
          {status && <span role={status.kind === 'error' ? 'alert' : 'status'} className={status.kind === 'error' ? 'text-sm text-status-fail' : 'text-sm text-status-pass'} data-testid="parameters-status">{status.text}</span>}
        </div>
      )}
    </form>
  );
}
