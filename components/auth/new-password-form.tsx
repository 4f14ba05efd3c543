'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { FormAlert } from '@/components/auth/auth-card';
import { Field } from '@/components/auth/field';
import { passwordChangeSchema, passwordResetSchema, type PasswordChangeInput } from '@/lib/domain/accounts/forms';
import { MIN_NEW_PASSWORD_LENGTH } from '@/lib/domain/accounts/password-policy';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

/**
 * Choosing a new password: from a reset link (`token`) or, signed in, on the Account page (asks for the
 * current one). Either way the person decides whether their API tokens survive.
 */
export function NewPasswordForm({ token }: { token?: string }) {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const reset = token !== undefined;
  const { register, handleSubmit, setError, reset: clear, formState: { errors, isSubmitting } } = useForm<PasswordChangeInput>({
    // The reset form has no current password; its schema is the change schema without that field.
    resolver: zodResolver((reset ? passwordResetSchema : passwordChangeSchema) as typeof passwordChangeSchema),
    defaultValues: reset ? { password: '', keepApiTokens: false } : { currentPassword: '', password: '', keepApiTokens: false },
  });

  async function onSubmit(values: PasswordChangeInput) {
    setFormError(null);
    try {
      if (reset) {
        await fetchJson(`/api/password-resets/${encodeURIComponent(token)}`, { method: 'POST', json: { password: values.password, keepApiTokens: values.keepApiTokens } });
        router.replace('/sign-in?notice=password-reset');
        return;
      }
      const res = await fetchJson<{ sessionsEnded: number; tokensRevoked: number }>('/api/account/password', { method: 'POST', json: values });
      clear();
      setDone(`Password changed. ${res.sessionsEnded} other session${res.sessionsEnded === 1 ? '' : 's'} signed out; ${res.tokensRevoked} API token${res.tokensRevoked === 1 ? '' : 's'} revoked.`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        for (const e of err.errors) setError(e.path as keyof PasswordChangeInput, { message: e.message });
      } else setFormError((err as Error).message);
    }
  }

  const prefix = reset ? 'reset' : 'change';
  return (
    <form onSubmit={handleSubmit(onSubmit)} className="space-y-4" noValidate>
      {!reset && (
        <Field id={`${prefix}-current`} label="Current password" type="password" autoComplete="current-password" registration={register('currentPassword')} error={errors.currentPassword?.message} />
      )}
      <Field id={`${prefix}-password`} label="New password" type="password" autoComplete="new-password" registration={register('password')} error={errors.password?.message}
        hint={`At least ${MIN_NEW_PASSWORD_LENGTH} characters, not your e-mail address.`} />
      <div className="flex items-start gap-2 text-sm">
        <input id={`${prefix}-keep-tokens`} type="checkbox" className="mt-1" {...register('keepApiTokens')} />
        <label htmlFor={`${prefix}-keep-tokens`}>
          Keep my API tokens working
          <span className="block text-xs text-ink-faint">Leave this unticked if you think someone else knew your password: every token is then revoked.</span>
        </label>
      </div>
      <p className="text-xs text-ink-faint">{reset ? 'Every session of yours ends, in every browser.' : 'Every other session of yours ends; this browser stays signed in.'}</p>
      {formError && <FormAlert>{formError}</FormAlert>}
      {done && <FormAlert tone="pass">{done}</FormAlert>}
      <button type="submit" className="btn-primary" disabled={isSubmitting}>{isSubmitting ? 'Saving…' : reset ? 'Set new password' : 'Change password'}</button>
    </form>
  );
}
