import type { UseFormRegisterReturn } from 'react-hook-form';

/** One labelled input with its hint and its error beside it (aria-describedby names both). */
export function Field({
  id,
  label,
  error,
  hint,
  registration,
  type = 'text',
  autoComplete,
}: {
  id: string;
  label: string;
  error?: string;
  hint?: string;
  registration: UseFormRegisterReturn;
  type?: string;
  autoComplete?: string;
}) {
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div>
      <label htmlFor={id} className="field-label">{label}</label>
      {hint && <p id={`${id}-hint`} className="text-xs text-ink-faint">{hint}</p>}
      <input id={id} type={type} autoComplete={autoComplete} className="field-input" aria-invalid={error ? true : undefined} aria-describedby={describedBy} {...registration} />
      {error && <p id={`${id}-error`} className="field-error" role="alert">{error}</p>}
    </div>
  );
}
