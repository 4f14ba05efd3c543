'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { FormAlert } from '@/components/auth/auth-card';
import { Field } from '@/components/auth/field';
import { passwordResetRequestSchema } from '@/lib/domain/accounts/forms';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

type Values = z.input<typeof passwordResetRequestSchema>;

export function ForgotPasswordForm() {
  const [done, setDone] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<Values>({
    resolver: zodResolver(passwordResetRequestSchema),
    defaultValues: { email: '' },
  });

  async function onSubmit(values: Values) {
    setFormError(null);
    try {
      const res = await fetchJson<{ message: string }>('/api/password-resets', { method: 'POST', json: values });
      setDone(res.message);
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        for (const e of err.errors) setError(e.path as keyof Values, { message: e.message });
      } else setFormError((err as Error).message);
    }
  }

  if (done) return <FormAlert tone="pass">{done}</FormAlert>;
  return (
    <form onSubmit={handleSubmit(onSubmit)} className="space-y-4" noValidate>
      <Field id="forgot-email" label="E-mail" type="email" autoComplete="username" registration={register('email')} error={errors.email?.message} />
      {formError && <FormAlert>{formError}</FormAlert>}
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>{isSubmitting ? 'Sending…' : 'Send me a reset link'}</button>
    </form>
  );
}
