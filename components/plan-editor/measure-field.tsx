'use client';

import { useFormContext, useWatch, get } from 'react-hook-form';
import { formatArea, formatLength, parseArea, parseLength, type UnitSystem } from '@/lib/domain/units';
import type { EditorField } from '@/lib/domain/plan';

/** Shows a typed length or area in the other unit system, so a mixed-unit entry can be checked at a glance. */
function OtherUnits({ name, kind }: { name: string; kind: 'length' | 'area' }) {
  const value = useWatch({ name });
  const units = (useWatch({ name: 'units' }) as UnitSystem) || 'imperial';
  if (value === undefined || value === null || String(value).trim() === '') return null;
  const raw = /^\d+(\.\d+)?$/.test(String(value).trim()) ? Number(value) : String(value);
  const parsed = kind === 'length' ? parseLength(raw, units, name) : parseArea(raw, units, name);
  if (!parsed.ok) return null;
  const other: UnitSystem = units === 'imperial' ? 'metric' : 'imperial';
  const shown =
    kind === 'length'
      ? `${formatLength(parsed.value, units)} · ${formatLength(parsed.value, other)}`
      : `${formatArea(parsed.value, units)} · ${formatArea(parsed.value, other)}`;
  return (
    <span className="mt-1 block font-mono text-xs text-ink-faint" data-testid={`convert-${name}`}>
      = {shown}
    </span>
  );
}

const selectLabel = (spec: EditorField, v: string | number) => spec.choiceLabels?.[String(v)] ?? String(v);

export function PlanField({ spec, name }: { spec: EditorField; name: string }) {
  const {
    register,
    formState: { errors },
  } = useFormContext();
  const error = get(errors, name) as { message?: string } | undefined;
  const id = `f-${name.replace(/\./g, '-')}`;
  const describedBy = [error ? `${id}-error` : null, spec.hint ? `${id}-hint` : null].filter(Boolean).join(' ') || undefined;
  const common = { id, 'aria-invalid': error ? true : undefined, 'aria-describedby': describedBy, ...register(name) };

  // Text another control sets (the library model a unit was filled from) is carried, not typed.
  if (spec.kind === 'text' && spec.display === 'hidden') return <input type="hidden" {...register(name)} />;

  let control: React.ReactNode;
  if (spec.kind === 'text' && spec.display === 'read-only') {
    control = <input {...common} type="text" readOnly placeholder="—" className="field-input bg-paper" />;
  } else if (spec.kind === 'presence') {
    control = (
      <select {...common} className="field-input">
        <option value="">— not known yet</option>
        <option value="present">Yes, there is one</option>
        <option value="none">None</option>
      </select>
    );
  } else if (spec.kind === 'boolean') {
    control = (
      <select {...common} className="field-input">
        <option value="">— not known yet</option>
        <option value="yes">Yes</option>
        <option value="no">No</option>
      </select>
    );
  } else if (spec.kind === 'choice') {
    control = (
      <select {...common} className="field-input">
        <option value="">— not known yet</option>
        {spec.choices?.map((o) => (
          <option key={String(o)} value={String(o)}>{selectLabel(spec, o)}</option>
        ))}
      </select>
    );
  } else {
    control = (
      <div className="relative">
        <input
          {...common}
          type="text"
          inputMode={spec.kind === 'number' ? 'decimal' : 'text'}
          autoComplete="off"
          spellCheck={false}
          className={`field-input ${spec.unit ? 'pr-12' : ''}`}
        />
        {spec.unit && <span className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-sm text-ink-faint">{spec.unit}</span>}
      </div>
    );
  }

  return (
    <div>
      <label htmlFor={id} className="field-label">{spec.label}</label>
      {control}
      {(spec.kind === 'length' || spec.kind === 'area') && <OtherUnits name={name} kind={spec.kind} />}
      {spec.hint && <p id={`${id}-hint`} className="mt-1 text-xs text-ink-faint">{spec.hint}</p>}
      {error?.message && <p id={`${id}-error`} className="field-error" role="alert">{error.message}</p>}
    </div>
  );
}
