'use client';

import { BusyButton } from '@/components/busy-button';
import { useState } from 'react';
import { useForm, type FieldErrors, type Resolver } from 'react-hook-form';
import { blankRule, parseRuleInput, ruleToInput, type RuleFormValues } from '@/lib/domain/rule-sets/rule-input';
import { ApiError } from '@/lib/platform/client/fetch-json';
import { factCatalog } from '@/lib/domain/facts';
import { areas, type StoredRule } from '@/lib/domain/rule-format';
import { citationText } from '@/lib/domain/vocabulary';

// Fields whose errors are shown per part (citation.code, messages.fail); every other path goes to its top-level field.
const NESTED = new Set(['citation', 'messages']);

function fieldOf(path: string): string {
  const parts = path.split('.');
  return NESTED.has(parts[0]) && parts.length > 1 ? `${parts[0]}.${parts[1]}` : parts[0];
}

/** Error paths → react-hook-form's nested error object; a deep path (conditions.all.0.fact) keeps its full path in the message. */
function toFormErrors(list: { path: string; message: string }[]): FieldErrors<RuleFormValues> {
  const out: Record<string, any> = {};
  for (const e of list) {
    const field = fieldOf(e.path);
    const text = e.path !== field ? `${e.path}: ${e.message}` : e.message;
    const [head, sub] = field.split('.');
    if (sub) {
      out[head] ??= {};
      out[head][sub] = { type: 'validation', message: out[head][sub] ? `${out[head][sub].message} ${text}` : text };
    } else out[head] = { type: 'validation', message: out[head] ? `${out[head].message} ${text}` : text };
  }
  return out as FieldErrors<RuleFormValues>;
}

// The same parse and catalog check the route handler runs, so a typo'd fact is caught before sending.
const ruleResolver: Resolver<RuleFormValues> = async (values) => {
  const parsed = parseRuleInput(values, '');
  return parsed.ok ? { values, errors: {} } : { values: {}, errors: toFormErrors(parsed.errors) };
};

function messageAt(errors: FieldErrors<RuleFormValues>, path: string): string | undefined {
  const node = path.split('.').reduce<unknown>((acc, k) => (acc as Record<string, unknown> | undefined)?.[k], errors) as { message?: string } | undefined;
  return node?.message;
}

export function RuleEditor({
  rule,
  isNew,
  onSave,
  onCancel,
}: {
  rule: RuleFormValues;
  isNew: boolean;
  onSave: (values: RuleFormValues) => Promise<void>;
  onCancel: () => void;
}) {
  const [status, setStatus] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<RuleFormValues>({ resolver: ruleResolver, defaultValues: rule });
  const prefix = `r-${(isNew ? 'new' : rule.key).replace(/\./g, '-')}`;

  async function submit(values: RuleFormValues) {
    setStatus(null);
    try {
      await onSave(values);
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        const nested = toFormErrors(err.errors.map((e) => ({ path: e.path.replace(/^rule\./, ''), message: e.message })));
        for (const [key, value] of Object.entries(nested)) {
          if (value && typeof value === 'object' && 'message' in value) setError(key as never, value as never);
          else for (const [sub, v] of Object.entries(value as object)) setError(`${key}.${sub}` as never, v as never);
        }
        setStatus('The rule has errors; nothing was saved.');
      } else setStatus((err as Error).message);
    }
  }

  const f = (path: string, label: string, input: (aria: Record<string, unknown>) => React.ReactNode, hint?: string) => {
    const id = `${prefix}-${path.replace(/\./g, '-')}`;
    const message = messageAt(errors, path);
    return (
      <div>
        <label htmlFor={id} className="field-label">{label}</label>
        {hint && <p className="text-xs text-ink-faint">{hint}</p>}
        {input({ id, 'aria-invalid': message ? true : undefined, 'aria-describedby': message ? `${id}-error` : undefined })}
        {message && <p id={`${id}-error`} role="alert" className="field-error whitespace-pre-wrap" data-testid={`error-${path}`}>{message}</p>}
      </div>
    );
  };

  return (
    <form onSubmit={handleSubmit(submit, () => setStatus('The rule has errors; nothing was saved.'))} noValidate className="space-y-4 rounded-md border border-brass bg-paper p-4" aria-label={isNew ? 'New rule' : `Edit rule ${rule.key}`}>
      <div className="grid gap-3 sm:grid-cols-2">
        {f('key', 'Key', (a) => <input {...a} {...register('key')} className="field-input font-mono" readOnly={!isNew} />, isNew ? 'Stable dotted name, e.g. local.washer-pan.' : 'Keys are stable; add a new rule for a new key.')}
        {f('title', 'Title', (a) => <input {...a} {...register('title')} className="field-input" />)}
        {f('area', 'Area', (a) => <select {...a} {...register('area')} className="field-input">{areas.map((x) => <option key={x}>{x}</option>)}</select>)}
        {f('severity', 'Outcome when not met', (a) => <select {...a} {...register('severity')} className="field-input"><option value="fail">fail</option><option value="caution">caution</option></select>)}
        {f('citation.code', 'Cited code', (a) => <input {...a} {...register('citation.code')} className="field-input" />, 'IRC, NEC, UPC…, local amendment, manufacturer’s instructions or common practice.')}
        {f('citation.edition', 'Edition (year)', (a) => <input {...a} {...register('citation.edition')} className="field-input" />)}
        {f('citation.section', 'Section', (a) => <input {...a} {...register('citation.section')} className="field-input" />)}
        {f('confidence', 'Source confidence', (a) => (
          <select {...a} {...register('confidence')} className="field-input">
            <option value="V">V — verified against the code text</option>
            <option value="S">S — secondary sources only</option>
            <option value="M">M — from memory, not verified</option>
            <option value="CP">CP — common practice, no published source</option>
          </select>
        ))}
      </div>
      {f('citationNote', 'Citation note (optional)', (a) => <input {...a} {...register('citationNote')} className="field-input" />, 'Why the citation needs confirming, if it does.')}
      {f('conditions', 'Conditions (json-rules-engine JSON: the passing state)', (a) => <textarea {...a} {...register('conditions')} rows={8} spellCheck={false} className="field-input font-mono text-sm" />, 'Every node needs a name. Facts come from the list below; parameters as {"fact":"params","path":"$.exhaust.maxDevelopedLengthIn"}.')}
      {f('applicability', 'Applicability (optional JSON: when false the finding is not applicable)', (a) => <textarea {...a} {...register('applicability')} rows={3} spellCheck={false} className="field-input font-mono text-sm" />)}
      <div className="grid gap-3 sm:grid-cols-2">
        {f('requires', 'Facts required (one per line)', (a) => <textarea {...a} {...register('requires')} rows={3} spellCheck={false} className="field-input font-mono text-sm" />, 'A missing one makes the finding needs-info.')}
        <div className="space-y-3">
          {f('measured', 'Fact shown as measured (optional)', (a) => <input {...a} {...register('measured')} list="known-facts" className="field-input font-mono text-sm" />)}
          {f('limit', 'Limit shown (optional)', (a) => <input {...a} {...register('limit')} className="field-input font-mono text-sm" />, 'A value, {"fact": …}, or {"min": …, "max": …}.')}
          {f('unit', 'Unit kind', (a) => <select {...a} {...register('unit')} className="field-input">{['length', 'area', 'cfm', 'count', 'amps', 'volts', 'boolean', 'text'].map((u) => <option key={u}>{u}</option>)}</select>)}
        </div>
      </div>
      <div className="grid gap-3 sm:grid-cols-3">
        {f('messages.pass', 'Message when it passes', (a) => <textarea {...a} {...register('messages.pass')} rows={3} className="field-input text-sm" />)}
        {f('messages.fail', 'Message when it fails', (a) => <textarea {...a} {...register('messages.fail')} rows={3} className="field-input text-sm" />, '{measured} and {limit} are filled in.')}
        {f('messages.notApplicable', 'Message when not applicable', (a) => <textarea {...a} {...register('messages.notApplicable')} rows={3} className="field-input text-sm" />)}
      </div>
      {f('remedy', 'Remedy key (optional)', (a) => <input {...a} {...register('remedy')} className="field-input font-mono text-sm" />)}
      <label className="flex items-center gap-2 text-sm"><input type="checkbox" {...register('enabled')} /> Runs in this rule set</label>
      <datalist id="known-facts">{factCatalog.map((fact) => <option key={fact.name} value={fact.name} />)}</datalist>
      {status && <p role="alert" className="text-sm text-status-fail" data-testid="rule-status">{status}</p>}
      <div className="flex gap-2">
        <BusyButton type="submit" className="btn-primary" busy={isSubmitting} busyText="Saving rule…">{isNew ? 'Add rule' : 'Save rule'}</BusyButton>
        <button type="button" className="btn-secondary" onClick={onCancel}>Cancel</button>
      </div>
    </form>
  );
}

export function FactReference() {
  return (
    <details className="card p-4 text-sm">
      <summary className="cursor-pointer font-semibold">Facts a rule may read ({factCatalog.length})</summary>
      <table className="mt-2 min-w-full">
        <thead className="text-left text-xs uppercase text-ink-faint"><tr><th className="py-1 pr-3">Fact</th><th className="pr-3">Kind</th><th>Meaning</th></tr></thead>
        <tbody className="divide-y divide-rule">
          {factCatalog.map((fact) => (
            <tr key={fact.name}><td className="py-1 pr-3 font-mono text-xs">{fact.name}</td><td className="pr-3">{fact.kind}</td><td>{fact.description}{fact.values ? ` (${fact.values.join(', ')})` : ''}</td></tr>
          ))}
        </tbody>
      </table>
    </details>
  );
}

export function RuleTable({
  rules,
  readOnly,
  onSaveRule,
  onAddRule,
  onDeleteRule,
}: {
  rules: StoredRule[];
  readOnly: boolean;
  onSaveRule?: (key: string, values: RuleFormValues | StoredRule) => Promise<void>;
  onAddRule?: (values: RuleFormValues) => Promise<void>;
  onDeleteRule?: (key: string) => Promise<void>;
}) {
  const [editing, setEditing] = useState<string | null>(null);
  const [adding, setAdding] = useState<RuleFormValues | null>(null);
  const [error, setError] = useState<string | null>(null);
  const act = async (work: () => Promise<void>) => {
    setError(null);
    try {
      await work();
    } catch (err) {
      setError((err as Error).message);
    }
  };
  return (
    <div className="space-y-3">
      {error && <p role="alert" className="rounded-md bg-status-fail/10 px-3 py-2 text-sm text-status-fail">{error}</p>}
      <ul className="divide-y divide-rule rounded-md border border-rule bg-white">
        {rules.map((rule) => (
          <li key={rule.key} className="p-3" data-rule-key={rule.key} data-enabled={rule.enabled}>
            <div className="flex flex-wrap items-center justify-between gap-2">
              <div className={rule.enabled ? '' : 'opacity-60'}>
                <span className="font-mono text-xs text-ink-faint">{rule.key}</span>
                <div className="font-semibold">{rule.title}{!rule.enabled && <span className="ml-2 text-xs font-semibold uppercase text-ink-faint">disabled</span>}</div>
                <div className="text-xs text-ink-soft">
                  {rule.area} · {rule.severity} · {citationText(rule.citation)} · confidence {rule.confidence}
                </div>
              </div>
              {readOnly ? (
                <details className="text-xs"><summary className="cursor-pointer">JSON</summary><pre className="mt-1 max-w-xl overflow-auto bg-paper p-2">{JSON.stringify(rule, null, 2)}</pre></details>
              ) : (
                <div className="flex gap-2">
                  <button type="button" className="btn-secondary px-3 py-1" onClick={() => act(() => onSaveRule!(rule.key, { ...rule, enabled: !rule.enabled }))}>
                    {rule.enabled ? 'Disable' : 'Re-enable'}<span className="sr-only"> {rule.key}</span>
                  </button>
                  <button type="button" className="btn-secondary px-3 py-1" onClick={() => setEditing(editing === rule.key ? null : rule.key)}>
                    Edit<span className="sr-only"> {rule.key}</span>
                  </button>
                </div>
              )}
            </div>
            {editing === rule.key && onSaveRule && (
              <div className="mt-3">
                <RuleEditor
                  rule={ruleToInput(rule)}
                  isNew={false}
                  onSave={async (values) => {
                    await onSaveRule(rule.key, values);
                    setEditing(null);
                  }}
                  onCancel={() => setEditing(null)}
                />
                {onDeleteRule && (
                  <button type="button" className="btn-danger mt-2 px-3 py-1" onClick={() => act(async () => { await onDeleteRule(rule.key); setEditing(null); })}>
                    Remove this rule from the draft
                  </button>
                )}
              </div>
            )}
          </li>
        ))}
      </ul>
      {!readOnly && onAddRule && (
        adding ? (
          <RuleEditor rule={adding} isNew onSave={async (values) => { await onAddRule(values); setAdding(null); }} onCancel={() => setAdding(null)} />
        ) : (
          <button type="button" className="btn-secondary" onClick={() => setAdding(blankRule())}>Add a rule</button>
        )
      )}
    </div>
  );
}
