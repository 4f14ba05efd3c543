'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { acceptInvitationSchema, type AcceptInvitationInput } from '@/lib/domain/accounts/people';
import { MIN_NEW_PASSWORD_LENGTH } from '@/lib/domain/accounts/password-policy';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

export function AcceptInvitationForm({ token, email }: { token: string; email: string }) {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<AcceptInvitationInput>({ resolver: zodResolver(acceptInvitationSchema), defaultValues: { name: '', password: '' } });

  async function onSubmit(values: AcceptInvitationInput) {
    setFormError(null);
    try {
      await fetchJson(`/api/invitations/${token}/accept`, { method: 'POST', json: values });
      // The app shell reads the new session cookie on the next render.
      router.replace('/home');
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        for (const e of err.errors) setError(e.path as keyof AcceptInvitationInput, { message: e.message });
      } else setFormError((err as Error).message);
    }
  }

  const aria = (name: keyof AcceptInvitationInput, hint?: string) => ({
    id: `accept-${name}`,
    'aria-invalid': errors[name] ? true : undefined,
    'aria-describedby': [hint, errors[name] ? `accept-${name}-error` : null].filter(Boolean).join(' ') || undefined,
  });

  return (
    <form onSubmit={handleSubmit(onSubmit)} className="space-y-4" noValidate>
      <div>
        <label htmlFor="accept-email" className="field-label">E-mail</label>
        <input id="accept-email" value={email} readOnly autoComplete="username" className="field-input bg-paper-deep" />
      </div>
      <div>
        <label htmlFor="accept-name" className="field-label">Your name</label>
        <input {...register('name')} {...aria('name')} autoComplete="name" className="field-input" />
        {errors.name && <p id="accept-name-error" className="field-error" role="alert">{errors.name.message}</p>}
      </div>
      <div>
        <label htmlFor="accept-password" className="field-label">Choose a password</label>
        <p id="accept-password-hint" className="text-xs text-ink-faint">At least {MIN_NEW_PASSWORD_LENGTH} characters, and not your e-mail address.</p>
        <input {...register('password')} {...aria('password', 'accept-password-hint')} type="password" autoComplete="new-password" className="field-input" />
        {errors.password && <p id="accept-password-error" className="field-error" role="alert">{errors.password.message}</p>}
      </div>
      {formError && <p role="alert" className="rounded-md bg-status-fail/10 px-3 py-2 text-sm text-status-fail">{formError}</p>}
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
        {isSubmitting ? 'Creating your account…' : 'Accept and create my account'}
      </button>
    </form>
  );
}
