'use client';

import { useRouter } from 'next/navigation';
import { useContext, useEffect, useMemo, useState, type MutableRefObject, type ReactNode } from 'react';
import { FormProvider, useFieldArray, useForm, useFormContext, useWatch, type FieldErrors, type Resolver } from 'react-hook-form';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';
import type { RuleSetParameters } from '@/lib/domain/params';
import type { PlanInput } from '@/lib/domain/plan';
import { editorSections, type EditorList, type EditorSection } from '@/lib/domain/plan/editor';
import { entryAt } from '@/lib/domain/plan/registry';
import { ExhaustRouteBuilder } from '@/components/plan-editor/exhaust-route-builder';
import { formToPlan, isShown, planToForm, type FormValues } from '@/components/plan-editor/form-values';
import { LibraryModelPicker } from '@/components/plan-editor/library-model-picker';
import { ListLimit } from '@/components/plan-editor/list-limit';
import { PlanField } from '@/components/plan-editor/measure-field';
import { useKeepFocus } from '@/components/plan-editor/keep-focus';
import { SectionStatusContext, useSectionFailCount, useSectionStatusSource, type SectionStatus } from '@/components/plan-editor/section-status';
import type { FieldError } from '@/lib/domain/errors';
import { LiveCheckPanel, LiveCheckProvider, type LiveSource } from '@/components/live-check/live-check-panel';
import { LiveCheckContext, REVEAL_FIELD_EVENT } from '@/components/live-check/live-check-context';

/** Each section's failing count: the live check's once it runs, else the latest stored check's. */
function SectionCounts({ stored, children }: { stored: SectionStatus; children: ReactNode }) {
  const live = useContext(LiveCheckContext);
  const value = useMemo<SectionStatus>(() => {
    if (live.state !== 'ready') return stored;
    const failBySection: SectionStatus['failBySection'] = {};
    for (const [id, counts] of Object.entries(live.bySection)) failBySection[id as EditorSection['id']] = counts?.fail ?? 0;
    return { source: 'live', failBySection, caption: 'from the live check' };
  }, [live, stored]);
  return <SectionStatusContext.Provider value={value}>{children}</SectionStatusContext.Provider>;
}


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
// The schema (and zod under it) loads on first validation, so it does not hold up the form's first paint.
const planResolver: Resolver<FormValues> = async (values) => {
  const { parsePlan } = await import('@/lib/domain/plan');
  const parsed = parsePlan(formToPlan(values));
  if (parsed.ok) return { values, errors: {} };
  return { values: {}, errors: toFormErrors(parsed.errors) };
};

function ListEditor({ list, plan }: { list: EditorList; plan: PlanInput }) {
  const { control } = useFormContext();
  const { fields, append, remove } = useFieldArray({ control, name: list.path });
  const full = fields.length >= list.max;
  const id = `f-${list.path.replace(/\./g, '-')}`;
  const focusNext = useKeepFocus();
  const item = list.itemLabel.toLowerCase();
  return (
    <fieldset id={id} className="mt-4 rounded-lg border border-rule p-4" aria-describedby={`${id}-limit`}>
      <legend className="px-1 text-base font-semibold">{list.label}</legend>
      {fields.length === 0 && <p className="text-sm text-ink-soft">None yet.</p>}
      <ol className="space-y-4">
        {fields.map((f, i) => (
          <li key={f.id} className="rounded-md border border-rule bg-white p-3">
            <fieldset>
              <legend className="sr-only">{list.itemLabel} {i + 1}</legend>
              <div className="mb-2 flex items-center justify-between">
                <span className="text-sm font-semibold" aria-hidden="true">{list.itemLabel} {i + 1}</span>
                <button
                  type="button"
                  id={`${id}-remove-${i}`}
                  className="btn-danger px-2 py-1 text-xs"
                  onClick={() => {
                    remove(i);
                    const left = fields.length - 1;
                    focusNext(left === 0 ? `${id}-add` : `${id}-remove-${Math.min(i, left - 1)}`);
                  }}
                >
                  Remove {item} {i + 1}
                </button>
              </div>
              <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
                {list.fields.map((spec) => {
                  const name = `${list.path}.${i}.${spec.path}`;
                  return isShown(spec, plan, name) ? <PlanField key={spec.path} spec={spec} name={name} /> : null;
                })}
              </div>
            </fieldset>
          </li>
        ))}
      </ol>
      <button
        type="button"
        id={`${id}-add`}
        className="btn-secondary mt-3"
        onClick={() => {
          append({ ...list.newItem }, { shouldFocus: false });
          const first = list.fields[0];
          if (first) focusNext(`${id}-${fields.length}-${first.path.replace(/\./g, '-')}`);
        }}
        disabled={full}
      >
        Add {item}
      </button>
      <ListLimit name={list.path} count={fields.length} max={list.max} noun={list.label.toLowerCase()} />
    </fieldset>
  );
}

function getPath(values: FormValues, path: string): unknown {
  return path.split('.').reduce<unknown>((o, k) => (o == null ? undefined : (o as Record<string, unknown>)[k]), values);
}

/** The sections, fields and lists that apply to the plan as it stands (no gas details for an electric dryer). */
function useVisibleSections(): { sections: EditorSection[]; plan: PlanInput } {
  const values = useWatch() as FormValues;
  const plan = formToPlan(values);
  const sections = editorSections
    .filter((s) => !s.shownWhen || getPath(values, s.shownWhen.path) === s.shownWhen.equals)
    .map((s) => ({
      ...s,
      fields: s.fields.filter((spec) => isShown(spec, plan, spec.appliesPath ?? spec.path)),
      lists: s.lists.filter((list) => isShown(list, plan, list.path)),
    }))
    .filter((s) => s.fields.length > 0 || s.lists.length > 0);
  return { sections, plan };
}

function failText(count: number | null): string {
  if (count === null) return 'not checked yet';
  return count === 0 ? 'none failing' : `${count} failing`;
}

function StatusBadge({ id }: { id: EditorSection['id'] }) {
  const count = useSectionFailCount(id);
  return (
    <span
      className={`rounded-full px-2 py-0.5 text-xs font-semibold ${count ? 'bg-status-fail/10 text-status-fail' : 'bg-paper-deep text-ink-soft'}`}
      data-testid={`section-status-${id}`}
    >
      {failText(count)}
    </span>
  );
}

/** Links to every section; on a phone, following one opens that section and closes the others. */
function JumpList({ sections, onJump }: { sections: EditorSection[]; onJump: (id: EditorSection['id']) => void }) {
  const { caption } = useSectionStatusSource();
  return (
    <nav aria-label="Plan sections" className="no-print" data-testid="section-jump-list">
      <ul className="flex gap-2 overflow-x-auto pb-1 sm:flex-wrap">
        {sections.map((s) => (
          <li key={s.id} className="shrink-0">
            <a
              href={`#section-${s.id}`}
              onClick={() => onJump(s.id)}
              className="inline-flex min-h-[44px] items-center gap-2 rounded-md border border-rule bg-white px-3 text-sm font-semibold text-ink underline-offset-2 hover:underline"
            >
              {s.title} <StatusBadge id={s.id} />
            </a>
          </li>
        ))}
      </ul>
      {caption && <p className="mt-1 text-xs text-ink-soft">Failing counts {caption}.</p>}
    </nav>
  );
}

/**
 * One plan section as a fieldset named by its legend. On a phone it collapses to its title and how many
 * findings fail in it; wider screens always show it whole.
 */
function PlanSection({ section, plan, params, open, onToggle }: { section: EditorSection; plan: PlanInput; params: RuleSetParameters; open: boolean; onToggle: () => void }) {
  const bodyId = `section-body-${section.id}`;
  return (
    <fieldset id={`section-${section.id}`} data-section={section.id} data-open={open} className="card min-w-0 scroll-mt-28 p-5">
      <legend className="float-left w-full">
        <button
          type="button"
          className="flex min-h-[44px] w-full items-center justify-between gap-3 text-left text-lg font-bold sm:hidden"
          aria-expanded={open}
          aria-controls={bodyId}
          onClick={onToggle}
          data-testid={`section-toggle-${section.id}`}
        >
          <span>{section.title}</span>
          <StatusBadge id={section.id} />
        </button>
        <span className="hidden items-center gap-3 text-lg font-bold sm:flex">
          {section.title}
        </span>
      </legend>
      <div id={bodyId} className={`clear-both ${open ? 'block' : 'hidden sm:block'}`} data-testid={`section-body-${section.id}`}>
        {section.intro && <p className="mt-1 text-sm text-ink-soft">{section.intro}</p>}
        {(section.id === 'washer' || section.id === 'dryer') && <LibraryModelPicker slot={section.id} />}
        {section.fields.length > 0 && (
          <div className="mt-4 grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            {section.fields.map((spec) => <PlanField key={spec.path} spec={spec} name={spec.path} />)}
          </div>
        )}
        {section.lists.map((list) =>
          list.bespoke === 'exhaust-route-builder' ? (
            <div key={list.path} className="mt-5"><ExhaustRouteBuilder list={list} params={params} /></div>
          ) : (
            <ListEditor key={list.path} list={list} plan={plan} />
          ),
        )}
      </div>
    </fieldset>
  );
}

function sectionOfElement(el: Element | null): EditorSection['id'] | null {
  return (el?.closest('[data-section]')?.getAttribute('data-section') as EditorSection['id'] | null) ?? null;
}

function Sections({ params, openId, setOpenId }: { params: RuleSetParameters; openId: EditorSection['id'] | null; setOpenId: (id: EditorSection['id'] | null) => void }) {
  const { sections, plan } = useVisibleSections();
  const jump = (id: EditorSection['id']) => setOpenId(id);
  return (
    <>
      <JumpList sections={sections} onJump={jump} />
      {sections.map((section) => (
        <PlanSection
          key={section.id}
          section={section}
          plan={plan}
          params={params}
          open={openId === section.id}
          onToggle={() => setOpenId(openId === section.id ? null : section.id)}
        />
      ))}
    </>
  );
}

export function PlanEditor({
  projectId,
  initialPlan,
  baseRevision,
  params,
  saveBeforeCheck = false,
  submit,
  sectionStatus = { source: 'none', failBySection: {} },
  live = null,
  planOnScreenRef,
}: {
  projectId: string | null;
  initialPlan: PlanInput | null;
  baseRevision: number | null;
  params: RuleSetParameters;
  /** The form does not show the saved revision as it is (it was cut to the plan limits): save before a check. */
  saveBeforeCheck?: boolean;
  /** Instead of saving a revision (a quick check without a project): what the submit button does with the plan. */
  submit?: { label: string; run: (plan: PlanInput) => Promise<string> };
  /** Failing findings per section, from the latest stored check. */
  sectionStatus?: SectionStatus;
  /** Where the live check reads its rules; without it the editor shows no live panel. */
  live?: LiveSource | null;
  /** Set to a reader of the plan as the form shows it now: null (with the fields' messages shown) while it is not valid. */
  planOnScreenRef?: MutableRefObject<(() => Promise<PlanInput | null>) | null>;
}) {
  const router = useRouter();
  const defaultValues = useMemo(() => planToForm(initialPlan), [initialPlan]);
  const form = useForm<FormValues>({ defaultValues, resolver: planResolver, mode: 'onChange' });
  const { formState, handleSubmit, reset, setError } = form;
  const [status, setStatus] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const [summaryErrors, setSummaryErrors] = useState<FieldError[]>([]);
  const [running, setRunning] = useState(false);
  const dirty = formState.isDirty;
  const failWord = submit ? 'Not checked' : 'Not saved';
  // On a phone one section is open at a time; the first until the installer picks another.
  const [openId, setOpenId] = useState<EditorSection['id'] | null>(editorSections[0]?.id ?? null);

  useEffect(() => {
    if (!planOnScreenRef) return;
    planOnScreenRef.current = async () => ((await form.trigger()) ? formToPlan(form.getValues()) : null);
    return () => {
      planOnScreenRef.current = null;
    };
  }, [planOnScreenRef, form]);

  // A link to a section or a field (the jump list, the error summary, a shared address) opens its section.
  useEffect(() => {
    const openFor = (hash: string) => {
      const target = hash.length > 1 ? document.getElementById(decodeURIComponent(hash.slice(1))) : null;
      const section = sectionOfElement(target);
      if (section) setOpenId(section);
    };
    openFor(window.location.hash);
    const onClick = (e: MouseEvent) => {
      const a = (e.target as HTMLElement)?.closest?.('a[href^="#"]') as HTMLAnchorElement | null;
      if (a) openFor(a.getAttribute('href') ?? '');
    };
    const onHash = () => openFor(window.location.hash);
    const onReveal = (e: Event) => {
      const id = (e as CustomEvent<{ id?: string }>).detail?.id;
      if (id) openFor(`#${id}`);
    };
    window.addEventListener(REVEAL_FIELD_EVENT, onReveal);
    document.addEventListener('click', onClick, true);
    window.addEventListener('hashchange', onHash);
    return () => {
      document.removeEventListener('click', onClick, true);
      window.removeEventListener('hashchange', onHash);
      window.removeEventListener(REVEAL_FIELD_EVENT, onReveal);
    };
  }, []);

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
      if (submit) {
        setStatus({ kind: 'ok', text: await submit.run(formToPlan(values)) });
        return null;
      }
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
        const first = errs[0] ? sectionOfElement(document.getElementById(`f-${formPathFor(errs[0].path).replace(/\./g, '-')}`)) : null;
        if (first) setOpenId(first);
        setSummaryErrors(errs);
        setStatus({ kind: 'error', text: `${failWord}: fix the fields listed below.` });
      } else {
        setStatus({ kind: 'error', text: `${failWord}: ${(err as Error).message} Your changes are still here.` });
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
    const first = list[0] ? sectionOfElement(document.getElementById(`f-${formPathFor(list[0].path).replace(/\./g, '-')}`)) : null;
    if (first) setOpenId(first);
    setSummaryErrors(list);
    setStatus({ kind: 'error', text: `${failWord}: fix the fields listed below.` });
  };

  return (
    <FormProvider {...form}>
      <LiveCheckProvider source={live ?? { jurisdiction: '', version: null }}>
      <div className={live ? 'grid items-start gap-5 lg:grid-cols-[minmax(0,1fr)_24rem]' : undefined}>
      <form onSubmit={handleSubmit(save, onInvalid)} noValidate className="space-y-5" aria-label="Closet plan">
        <div className="no-print sticky top-0 z-10 -mx-4 flex flex-wrap items-center gap-3 border-b border-rule bg-paper/95 px-4 py-3 backdrop-blur">
          <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>{submit?.label ?? 'Save plan'}</button>
          {!submit && <button type="button" className="btn-secondary" onClick={runCheck} disabled={running || dirty || saveBeforeCheck || baseRevision === null}
            title={dirty || saveBeforeCheck ? 'Save the plan first' : baseRevision === null ? 'Save the first plan revision first' : undefined}>
            {running ? 'Running check…' : 'Run check'}
          </button>}
          {!submit && <button type="button" className="btn-secondary" onClick={() => void saveAndCheck()} disabled={running || formState.isSubmitting}>Save and check</button>}
          {!submit && <span className="text-sm text-ink-soft" data-testid="editor-state">
            {dirty ? 'Unsaved changes' : baseRevision ? `Revision ${baseRevision} saved` : 'Not saved yet'}
          </span>}
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

        <SectionCounts stored={sectionStatus}>
          <Sections params={params} openId={openId} setOpenId={setOpenId} />
        </SectionCounts>
      </form>
      {live && <LiveCheckPanel source={live} />}
      </div>
      </LiveCheckProvider>
    </FormProvider>
  );
}
