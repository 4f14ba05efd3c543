'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useMemo, useState } from 'react';
import { FormProvider, useFieldArray, useForm, useFormContext, useWatch, type FieldErrors, type Resolver } from 'react-hook-form';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';
import type { RuleSetParameters } from '@/lib/domain/params';
import { editorSections, entryAt, parsePlan, type EditorList, type PlanInput } from '@/lib/domain/plan';
import { ExhaustRouteBuilder } from '@/components/plan-editor/exhaust-route-builder';
import { formToPlan, planToForm, type FormValues } from '@/components/plan-editor/form-values';
import { ListLimit } from '@/components/plan-editor/list-limit';
import { PlanField } from '@/components/plan-editor/measure-field';
import type { FieldError } from '@/lib/domain/errors';
import { LiveCheckPanel, LiveCheckProvider, type LiveSource } from '@/components/live-check/live-check-panel';


/** Maps a plan path to the editor field that shows it ("doors.0.hinges.2" → "doors.0.hinges"). */
function formPathFor(planPath: string): string {
  const parts = planPath.split('.');
  const list = entryAt(parts.slice(0, -1).join('.'))?.entry;
  // A list of plain values is typed into one field, so its items' errors show there.
  const inOneField = /^\d+$/.test(parts[parts.length - 1]) && list?.kind === 'list' && list.item.kind !== 'group';
  return inOneField ? parts.slice(0, -1).join('.') : planPath;
}

function toFormErrors(errors: FieldError[]): FieldErrors<FormValues> {
  const out: any = {};
  for (const e of errors) {
    const keys = formPathFor(e.path).split('.');
    let o = out;
    for (const k of keys.slice(0, -1)) o = o[k] ??= {};
    o[keys[keys.length - 1]] ??= { type: 'validate', message: e.message };
  }
  return out;
}

// The editor validates with the plan's own schema (the one the API parses), after turning its text fields into a plan.
const planResolver: Resolver<FormValues> = async (values) => {
  const parsed = parsePlan(formToPlan(values));
  if (parsed.ok) return { values, errors: {} };
  return { values: {}, errors: toFormErrors(parsed.errors) };
};

function ListEditor({ list }: { list: EditorList }) {
  const { control } = useFormContext();
  const { fields, append, remove } = useFieldArray({ control, name: list.path });
  const full = fields.length >= list.max;
  const id = `f-${list.path.replace(/\./g, '-')}`;
  return (
    <fieldset id={id} className="mt-4 rounded-lg border border-rule p-4" aria-describedby={`${id}-limit`}>
      <legend className="px-1 text-base font-semibold">{list.label}</legend>
      {fields.length === 0 && <p className="text-sm text-ink-faint">None yet.</p>}
      <ol className="space-y-4">
        {fields.map((f, i) => (
          <li key={f.id} className="rounded-md border border-rule bg-white p-3">
            <div className="mb-2 flex items-center justify-between">
              <span className="text-sm font-semibold">{list.itemLabel} {i + 1}</span>
              <button type="button" className="btn-danger px-2 py-1 text-xs" onClick={() => remove(i)}>Remove {list.itemLabel.toLowerCase()} {i + 1}</button>
            </div>
            <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
              {list.fields.map((spec) => (
                <PlanField key={spec.path} spec={spec} name={`${list.path}.${i}.${spec.path}`} />
              ))}
            </div>
          </li>
        ))}
      </ol>
      <button type="button" className="btn-secondary mt-3" onClick={() => append({ ...list.newItem })} disabled={full}>Add {list.itemLabel.toLowerCase()}</button>
      <ListLimit name={list.path} count={fields.length} max={list.max} noun={list.label.toLowerCase()} />
    </fieldset>
  );
}

function getPath(values: FormValues, path: string): unknown {
  return path.split('.').reduce<unknown>((o, k) => (o == null ? undefined : (o as Record<string, unknown>)[k]), values);
}

function Sections({ params }: { params: RuleSetParameters }) {
  const values = useWatch() as FormValues;
  return (
    <>
      {editorSections.map((section) => {
        if (section.shownWhen && getPath(values, section.shownWhen.path) !== section.shownWhen.equals) return null;
        return (
          <section key={section.id} id={`section-${section.id}`} aria-labelledby={`h-${section.id}`} className="card p-5">
            <h2 id={`h-${section.id}`} className="text-lg font-bold">{section.title}</h2>
            {section.intro && <p className="mt-1 text-sm text-ink-soft">{section.intro}</p>}
            {section.fields.length > 0 && (
              <div className="mt-4 grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
                {section.fields.map((spec) => <PlanField key={spec.path} spec={spec} name={spec.path} />)}
              </div>
            )}
            {section.lists.map((list) =>
              list.bespoke === 'exhaust-route-builder' ? (
                <div key={list.path} className="mt-5"><ExhaustRouteBuilder list={list} params={params} /></div>
              ) : (
                <ListEditor key={list.path} list={list} />
              ),
            )}
          </section>
        );
      })}
    </>
  );
}

export function PlanEditor({
  projectId,
  initialPlan,
  baseRevision,
  params,
  saveBeforeCheck = false,
  live = null,
}: {
  projectId: string;
  initialPlan: PlanInput | null;
  baseRevision: number | null;
  params: RuleSetParameters;
  /** The form does not show the saved revision as it is (it was cut to the plan limits): save before a check. */
  saveBeforeCheck?: boolean;
  /** Where the live check reads its rules; without it the editor shows no live panel. */
  live?: LiveSource | null;
}) {
  const router = useRouter();
  const defaultValues = useMemo(() => planToForm(initialPlan), [initialPlan]);
  const form = useForm<FormValues>({ defaultValues, resolver: planResolver, mode: 'onChange' });
  const { formState, handleSubmit, reset, setError } = form;
  const [status, setStatus] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const [summaryErrors, setSummaryErrors] = useState<FieldError[]>([]);
  const [running, setRunning] = useState(false);
  const dirty = formState.isDirty;

  // Unsaved changes are not lost by closing the tab or following a link without a warning.
  useEffect(() => {
    if (!dirty) return;
    const onBeforeUnload = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = '';
    };
    const onClick = (e: MouseEvent) => {
      const a = (e.target as HTMLElement)?.closest?.('a[href]') as HTMLAnchorElement | null;
      if (!a || a.target === '_blank' || a.href.startsWith('javascript:')) return;
      if (!window.confirm('This plan has unsaved changes. Leave without saving them?')) {
        e.preventDefault();
        e.stopPropagation();
      }
    };
    window.addEventListener('beforeunload', onBeforeUnload);
    document.addEventListener('click', onClick, true);
    return () => {
      window.removeEventListener('beforeunload', onBeforeUnload);
      document.removeEventListener('click', onClick, true);
    };
  }, [dirty]);

  async function save(values: FormValues): Promise<number | null> {
    setStatus(null);
    setSummaryErrors([]);
    try {
      const res = await fetchJson<{ revision: { number: number; changeSummary: string } }>(`/api/projects/${projectId}/plans`, {
        method: 'POST',
        json: { plan: formToPlan(values) },
      });
      reset(values);
      setStatus({ kind: 'ok', text: `Saved as revision ${res.revision.number}: ${res.revision.changeSummary}.` });
      router.refresh();
      return res.revision.number;
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        const errs = err.errors.map((e) => ({ path: e.path.replace(/^plan\./, ''), message: e.message }));
        for (const e of errs) setError(formPathFor(e.path), { type: 'server', message: e.message });
        setSummaryErrors(errs);
        setStatus({ kind: 'error', text: 'Not saved: fix the fields listed below.' });
      } else {
        setStatus({ kind: 'error', text: `Not saved: ${(err as Error).message} Your changes are still here.` });
      }
      return null;
    }
  }

  async function runCheck() {
    setRunning(true);
    setStatus(null);
    try {
      const res = await fetchJson<{ id: string }>(`/api/projects/${projectId}/checks`, { method: 'POST', json: {} });
      router.push(`/projects/${projectId}/checks/${res.id}`);
    } catch (err) {
      setStatus({ kind: 'error', text: `The check did not run: ${(err as Error).message}` });
      setRunning(false);
    }
  }

  // Save, then check the revision just saved on the server; a refused save checks nothing and keeps every edit.
  const saveAndCheck = handleSubmit(async (values) => {
    if ((await save(values)) !== null) await runCheck();
  }, (errors) => onInvalid(errors));

  const onInvalid = (errors: FieldErrors<FormValues>) => {
    const list: FieldError[] = [];
    const walk = (o: any, path: string) => {
      if (!o || typeof o !== 'object') return;
      if (typeof o.message === 'string') list.push({ path, message: o.message });
      for (const [k, v] of Object.entries(o)) if (k !== 'ref' && k !== 'message' && k !== 'type') walk(v, path ? `${path}.${k}` : k);
    };
    walk(errors, '');
    setSummaryErrors(list);
    setStatus({ kind: 'error', text: 'Not saved: fix the fields listed below.' });
  };

  return (
    <FormProvider {...form}>
      <LiveCheckProvider source={live ?? { jurisdiction: '', version: null }}>
      <div className={live ? 'grid items-start gap-5 lg:grid-cols-[minmax(0,1fr)_24rem]' : undefined}>
      <form onSubmit={handleSubmit(save, onInvalid)} noValidate className="space-y-5" aria-label="Closet plan">
        <div className="no-print sticky top-0 z-10 -mx-4 flex flex-wrap items-center gap-3 border-b border-rule bg-paper/95 px-4 py-3 backdrop-blur">
          <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>Save plan</button>
          <button type="button" className="btn-secondary" onClick={runCheck} disabled={running || dirty || saveBeforeCheck || baseRevision === null}
            title={dirty || saveBeforeCheck ? 'Save the plan first' : baseRevision === null ? 'Save the first plan revision first' : undefined}>
            {running ? 'Running check…' : 'Run check'}
          </button>
          <button type="button" className="btn-secondary" onClick={() => void saveAndCheck()} disabled={running || formState.isSubmitting}>Save and check</button>
          <span className="text-sm text-ink-soft" data-testid="editor-state">
            {dirty ? 'Unsaved changes' : baseRevision ? `Revision ${baseRevision} saved` : 'Not saved yet'}
          </span>
          {status && (
            <span role={status.kind === 'error' ? 'alert' : 'status'} className={`text-sm font-semibold ${status.kind === 'error' ? 'text-status-fail' : 'text-status-pass'}`} data-testid="editor-status">
              {status.text}
            </span>
          )}
        </div>

        {summaryErrors.length > 0 && (
          <div className="card border-status-fail/50 p-4" role="alert" data-testid="error-summary">
            <h2 className="font-semibold text-status-fail">{summaryErrors.length} field{summaryErrors.length === 1 ? '' : 's'} to fix</h2>
            <ul className="mt-2 list-disc space-y-1 pl-5 text-sm">
              {summaryErrors.map((e) => (
                <li key={e.path}>
                  <a className="underline" href={`#f-${formPathFor(e.path).replace(/\./g, '-')}`}>{e.message}</a>
                </li>
              ))}
            </ul>
          </div>
        )}

        <Sections params={params} />
      </form>
      {live && <LiveCheckPanel source={live} />}
      </div>
      </LiveCheckProvider>
    </FormProvider>
  );
}
