'use client';

import { useRouter } from 'next/navigation';
import { useState, type ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';
import { answerSchema, ANSWER_NOTE_MAX_CHARS, type AnswerInput } from '@/lib/domain/reports/thread';
import { formatDateTime } from '@/lib/domain/dates/format';

type LatestCheck = { id: string; createdAt: string; counts: string };

/**
 * The installer answers the inspector's corrections with the project's latest check (a report is issued
 * for it) and a note. A check no newer than the one the inspector saw cannot answer: run one first.
 */
export function AnswerForm({ open, reportCode, latestCheck, reviewedAt, projectId, timeZone }: { open: boolean; reportCode: string; latestCheck: LatestCheck | null; reviewedAt: string; projectId: string; timeZone: string }) {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<AnswerInput>({
    resolver: zodResolver(answerSchema),
    defaultValues: { checkId: latestCheck?.id ?? '', note: '' },
  });
  const fresh = latestCheck && +new Date(latestCheck.createdAt) > +new Date(reviewedAt);
  const noteId = `answer-note-${reportCode}`;

  if (done) return <AnswerCard><p role="status" className="font-semibold text-status-pass">{done}</p></AnswerCard>;
  if (!open) return null;
  if (!fresh) {
    return (
      <AnswerCard>
        <p className="mt-3 rounded border border-brass p-3 text-sm" data-testid="answer-needs-check">
          The inspector asked for corrections. Correct the plan, run a new check, then answer here with it and a note.{' '}
          <a className="underline" href={`/projects/${projectId}/plan`}>Open the plan</a>
        </p>
      </AnswerCard>
    );
  }

  async function onSubmit(values: AnswerInput) {
    setFormError(null);
    try {
      const res = await fetchJson<{ report: { code: string }; mailed: number }>(`/api/reports/${reportCode}/answers`, { method: 'POST', json: values });
      setDone(`Answer sent with report ${res.report.code}${res.mailed ? '; the e-mail to the inspector is queued' : ''}.`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) for (const e of err.errors) setError((e.path === 'checkId' ? 'checkId' : 'note') as never, { message: e.message });
      else setFormError((err as Error).message);
    }
  }

  return (
    <AnswerCard>
      <form onSubmit={handleSubmit(onSubmit)} noValidate className="mt-3 space-y-3 rounded border border-rule p-4" aria-label={`Answer the corrections on report ${reportCode}`}>
        <p className="font-semibold">Answer the corrections</p>
        <p className="text-ink-soft">
          With the latest check, run {formatDateTime(latestCheck.createdAt, timeZone)} ({latestCheck.counts}). A report is issued for it and sent with your note.
        </p>
        <input type="hidden" {...register('checkId')} />
        {errors.checkId && <p className="field-error" role="alert">{errors.checkId.message}</p>}
        <div>
          <label htmlFor={noteId} className="field-label">Note to the inspector: what you corrected</label>
          <textarea id={noteId} rows={3} maxLength={ANSWER_NOTE_MAX_CHARS} className="field-input" {...register('note')} aria-describedby={errors.note ? `${noteId}-error` : undefined} />
          {errors.note && <p id={`${noteId}-error`} className="field-error" role="alert">{errors.note.message}</p>}
        </div>
        {formError && <p role="alert" className="text-status-fail">{formError}</p>}
        <button type="submit" className="btn-primary" disabled={isSubmitting}>{isSubmitting ? 'Sending answer…' : 'Send answer'}</button>
      </form>
    </AnswerCard>
  );
}

function AnswerCard({ children }: { children: ReactNode }) {
  return <div className="card -mt-2 p-5 pt-2 text-sm">{children}</div>;
}
