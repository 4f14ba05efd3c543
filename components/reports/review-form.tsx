'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';
import { reviewSchema, type ReviewInput } from '@/lib/domain/reports/review-schema';
import { FindingCommentInputs, findingCommentField } from '@/components/reports/finding-comment-inputs';

type F = { ruleKey: string; title: string; status: string };

/** `revises`: the standing outcome this form revises, whose values it starts from. */
export function ReviewForm({ reportId, findings, revises, onCancel, onDone }: {
  reportId: string;
  findings: F[];
  revises?: { id: string; outcome: ReviewInput['outcome']; comment: string; findingComments: Record<string, string> };
  onCancel?: () => void;
  /** Told the confirmation once saved, for a parent that replaces the form with the recorded outcome. */
  onDone?: (message: string) => void;
}) {
  const router = useRouter();
  const [done, setDone] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  type Values = { outcome?: ReviewInput['outcome']; comment: string; fc: Record<string, string> };
  const encode = findingCommentField;
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<Values>({
    defaultValues: revises
      ? { outcome: revises.outcome, comment: revises.comment, fc: Object.fromEntries(Object.entries(revises.findingComments).map(([k, c]) => [encode(k), c])) }
      : { comment: '', fc: {} },
  });

  // A comment the API refused sits under its own finding's box.
  const fieldOfPath = (path: string) => (path === 'outcome' ? 'outcome' : path.startsWith('findingComments.') ? `fc.${encode(path.slice('findingComments.'.length))}` : 'comment');

  async function onSubmit(form: Values) {
    setFormError(null);
    const findingComments = Object.fromEntries(findings.map((f) => [f.ruleKey, form.fc?.[encode(f.ruleKey)] ?? '']).filter(([, c]) => c.trim()));
    // The same schema the API parses, checked here first so the message sits next to its field.
    const parsed = reviewSchema.safeParse({ outcome: form.outcome, comment: form.comment, findingComments, ...(revises ? { revises: revises.id } : {}) });
    if (!parsed.success) {
      for (const issue of parsed.error.issues) setError(fieldOfPath(issue.path.map(String).join('.')) as never, { message: issue.message });
      return;
    }
    const values = parsed.data;
    try {
      const res = await fetchJson<{ mailed: number }>(`/api/inspections/${reportId}/review`, { method: 'POST', json: values });
      const message = `${revises ? 'Outcome revised' : 'Outcome recorded'}${res.mailed ? ' and the e-mail to the installer is queued' : ''}.`;
      if (onDone) onDone(message);
      else setDone(message);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) for (const e of err.errors) setError(fieldOfPath(e.path) as never, { message: e.message });
      else setFormError((err as Error).message);
    }
  }

  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate className="card space-y-4 p-5" aria-label={revises ? 'Revise the inspection outcome' : 'Record the inspection outcome'}>
      <fieldset>
        <legend className="field-label">Outcome</legend>
        <div className="mt-2 flex flex-wrap gap-4">
          <label className="inline-flex items-center gap-2"><input type="radio" value="approved" {...register('outcome')} /> Approved</label>
          <label className="inline-flex items-center gap-2"><input type="radio" value="corrections-needed" {...register('outcome')} /> Corrections needed</label>
        </div>
        {errors.outcome && <p className="field-error" role="alert">{errors.outcome.message}</p>}
      </fieldset>
      <div>
        <label htmlFor="review-comment" className="field-label">Comment to the installer</label>
        <textarea id="review-comment" rows={3} className="field-input" {...register('comment')} aria-describedby={errors.comment ? 'review-comment-error' : undefined} />
        {errors.comment && <p id="review-comment-error" className="field-error" role="alert">{errors.comment.message}</p>}
      </div>
      <FindingCommentInputs findings={findings} register={register} errors={errors} />
      {formError && <p role="alert" className="text-sm text-status-fail">{formError}</p>}
      {done && <p role="status" className="text-sm font-semibold text-status-pass">{done}</p>}
      <div className="flex flex-wrap gap-3">
        <button type="submit" className="btn-primary" disabled={isSubmitting}>{revises ? 'Save revised outcome' : 'Record outcome'}</button>
        {onCancel && <button type="button" className="btn-secondary" onClick={onCancel}>Cancel</button>}
      </div>
    </form>
  );
}
