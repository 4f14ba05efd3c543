'use client';

import { get, useFormContext } from 'react-hook-form';

/** A refusal of a whole list (too many items), shown where the list is; item errors show at their fields. */
export function ListLimit({ name, count, max, noun }: { name: string; count: number; max: number; noun: string }) {
  const { formState } = useFormContext();
  const error = get(formState.errors, name) as { message?: unknown } | undefined;
  const id = `f-${name.replace(/\./g, '-')}`;
  return (
    <>
      <p id={`${id}-limit`} className="mt-2 text-xs text-ink-faint">
        {count} of at most {max} {noun}.
      </p>
      {typeof error?.message === 'string' && <p id={`${id}-error`} className="field-error" role="alert">{error.message}</p>}
    </>
  );
}
