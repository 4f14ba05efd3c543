'use client';

import { useFormContext, useWatch, get } from 'react-hook-form';
import { formatArea, formatLength, parseArea, parseLength, type UnitSystem } from '@/lib/domain/units';
import type { EditorField } from '@/lib/domain/plan/editor';

// The decimal keyboard a phone opens for measures has no ' or ", so feet and inch marks get their own keys.
const MARKS = [
  { mark: "'", name: 'feet mark' },
  { mark: '"', name: 'inch mark' },
] as const;

function MarkKeys({ name, id, label }: { name: string; id: string; label: string }) {
  const { setValue, getValues } = useFormContext();
  const type = (mark: string) => {
    const input = document.getElementById(id) as HTMLInputElement | null;
    const text = String(getValues(name) ?? '');
    const start = input?.selectionStart ?? text.length;
    const end = input?.selectionEnd ?? text.length;
    setValue(name, text.slice(0, start) + mark + text.slice(end), { shouldDirty: true });
    if (input) {
      input.focus();
      input.setSelectionRange(start + 1, start + 1);
    }
  };
  return (
    <span className="flex shrink-0 gap-1" data-testid={`marks-${name}`}>
      {MARKS.map(({ mark, name: markName }) => (
        <button
          key={mark}
          type="button"
          className="btn-secondary min-w-[44px] px-2 font-mono"
          // Keeps the field's focus and caret, so the mark lands where the installer is typing.
          onMouseDown={(e) => e.preventDefault()}
          onClick={() => type(mark)}
          aria-label={`Type a ${markName} in ${label}`}
        >
          {mark}
        </button>
      ))}
    </span>
  );
}

/** Shows a typed length or area in the other unit system, so a mixed-unit entry can be checked at a glance. */
function OtherUnits({ name, kind, thin }: { name: string; kind: 'length' | 'area'; thin?: boolean }) {
  const value = useWatch({ name });
  const units = (useWatch({ name: 'units' }) as UnitSystem) || 'imperial';
  if (value === undefined || value === null || String(value).trim() === '') return null;
  const raw = /^\d+(\.\d+)?$/.test(String(value).trim()) ? Number(value) : String(value);
  const parsed = kind === 'length' ? parseLength(raw, units, name) : parseArea(raw, units, name);
  if (!parsed.ok) return null;
  const other: UnitSystem = units === 'imperial' ? 'metric' : 'imperial';
  const shown =
    kind === 'length'
      ? `${formatLength(parsed.value, units, thin ? 'decimal' : undefined)} · ${formatLength(parsed.value, other, thin ? 'decimal' : undefined)}`
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
    getValues,
    formState: { errors },
  } = useFormContext();
  const error = get(errors, name) as { message?: string } | undefined;
  const id = `f-${name.replace(/\./g, '-')}`;
  const describedBy = [error ? `${id}-error` : null, spec.hint ? `${id}-hint` : null].filter(Boolean).join(' ') || undefined;
  // The value is also written into the markup, so the saved plan shows before the JavaScript has loaded.
  const saved = getValues(name);
  const common = {
    id,
    'aria-invalid': error ? true : undefined,
    'aria-describedby': describedBy,
    defaultValue: saved == null ? '' : String(saved),
    ...register(name),
  };
  const measured = spec.kind === 'length' || spec.kind === 'length-list' || spec.kind === 'area' || spec.kind === 'number';
  const marks = spec.kind === 'length' || spec.kind === 'length-list';

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
      <div className="flex items-end gap-1">
        <div className="relative min-w-0 flex-1">
          <input
            {...common}
            type="text"
            inputMode={measured ? 'decimal' : 'text'}
            autoComplete="off"
            spellCheck={false}
            className={`field-input ${spec.unit ? 'pr-12' : ''}`}
          />
          {spec.unit && <span className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-sm text-ink-soft">{spec.unit}</span>}
        </div>
        {marks && <MarkKeys name={name} id={id} label={spec.label} />}
      </div>
    );
  }

  return (
    <div>
      <label htmlFor={id} className="field-label">{spec.label}</label>
      {control}
      {(spec.kind === 'length' || spec.kind === 'area') && <OtherUnits name={name} kind={spec.kind} thin={spec.thin} />}
      {spec.hint && <p id={`${id}-hint`} className="mt-1 text-xs text-ink-faint">{spec.hint}</p>}
      {error?.message && <p id={`${id}-error`} className="field-error" role="alert">{error.message}</p>}
    </div>
  );
}
