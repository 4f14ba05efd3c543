'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { FormAlert } from '@/components/auth/auth-card';
import { Field } from '@/components/auth/field';
import { signUpSchema, type SignUpInput } from '@/lib/domain/accounts/forms';
import { MIN_NEW_PASSWORD_LENGTH } from '@/lib/domain/accounts/password-policy';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

export function SignUpForm() {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<SignUpInput>({
    resolver: zodResolver(signUpSchema),
    defaultValues: { company: '', name: '', email: '', password: '' },
  });

  async function onSubmit(values: SignUpInput) {
    setFormError(null);
    try {
      await fetchJson('/api/sign-up', { method: 'POST', json: values });
      router.replace('/projects?welcome=1');
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        for (const e of err.errors) setError(e.path as keyof SignUpInput, { message: e.message });
      } else setFormError((err as Error).message);
    }
  }

  return (
    <form onSubmit={handleSubmit(onSubmit)} className="space-y-4" noValidate>
      <Field id="sign-up-company" label="Company name" autoComplete="organization" registration={register('company')} error={errors.company?.message} />
      <Field id="sign-up-name" label="Your name" autoComplete="name" registration={register('name')} error={errors.name?.message} />
      <Field id="sign-up-email" label="Work e-mail" type="email" autoComplete="email" registration={register('email')} error={errors.email?.message}
        hint="We send a link to confirm it; reports go to inspectors only from a confirmed address." />
      <Field id="sign-up-password" label="Password" type="password" autoComplete="new-password" registration={register('password')} error={errors.password?.message}
        hint={`At least ${MIN_NEW_PASSWORD_LENGTH} characters, not your e-mail address.`} />
      {formError && <FormAlert>{formError}</FormAlert>}
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>{isSubmitting ? 'Setting up…' : 'Sign up your company'}</button>
    </form>
  );
}
