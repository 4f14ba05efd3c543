'use client';

import type { FieldErrors, UseFormRegister } from 'react-hook-form';

export type CommentableFinding = { ruleKey: string; title: string; status: string };
export type FindingCommentValues = { fc: Record<string, string> };

/** Rule keys contain dots, which the form library reads as nesting; field names encode them. */
export const findingCommentField = (ruleKey: string) => ruleKey.replace(/\./g, '__');

const statusWords: Record<string, string> = { pass: 'passes', fail: 'fails', caution: 'caution', 'needs-info': 'needs information', 'not-applicable': 'not applicable' };

/**
 * A comment box for every finding of the report. What does not pass is open; what passed or does not apply
 * is folded away but can be commented on too (a note on how something was built, a reminder for the visit).
 */
export function FindingCommentInputs<V extends FindingCommentValues>({
  findings,
  register,
  errors,
}: {
  findings: CommentableFinding[];
  register: UseFormRegister<V>;
  errors?: FieldErrors<V>;
}) {
  const flagged = findings.filter((f) => f.status !== 'pass' && f.status !== 'not-applicable');
  const rest = findings.filter((f) => f.status === 'pass' || f.status === 'not-applicable');
  const fcErrors = (errors as FieldErrors<FindingCommentValues> | undefined)?.fc as Record<string, { message?: string } | undefined> | undefined;
  const input = (f: CommentableFinding) => {
    const name = findingCommentField(f.ruleKey);
    const id = `fc-${f.ruleKey}`;
    const error = fcErrors?.[name]?.message;
    return (
      <div key={f.ruleKey}>
        <label htmlFor={id} className="text-sm">
          {f.title} <span className="text-ink-soft">({statusWords[f.status] ?? f.status})</span>
        </label>
        <input
          id={id}
          className="field-input"
          maxLength={2000}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : undefined}
          {...register(`fc.${name}` as Parameters<UseFormRegister<V>>[0])}
        />
        {error && <p id={`${id}-error`} className="field-error" role="alert">{error}</p>}
      </div>
    );
  };
  return (
    <div className="space-y-3" data-testid="finding-comment-inputs">
      {flagged.length > 0 && (
        <details open>
          <summary className="cursor-pointer text-sm font-semibold">Comments on findings ({flagged.length} not passing)</summary>
          <div className="mt-3 space-y-3">{flagged.map(input)}</div>
        </details>
      )}
      {rest.length > 0 && (
        <details>
          <summary className="cursor-pointer text-sm font-semibold">Comments on passed and not applicable findings ({rest.length})</summary>
          <div className="mt-3 space-y-3">{rest.map(input)}</div>
        </details>
      )}
    </div>
  );
}
