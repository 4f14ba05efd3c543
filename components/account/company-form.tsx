'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { FormAlert } from '@/components/auth/auth-card';
import { Field } from '@/components/auth/field';
import { companySettingsSchema } from '@/lib/domain/accounts/forms';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

type Values = z.input<typeof companySettingsSchema>;

export function CompanyForm({ initial, jurisdictions, editable }: { initial: Required<Values>; jurisdictions: { slug: string; name: string }[]; editable: boolean }) {
  const router = useRouter();
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<Values>({
    resolver: zodResolver(companySettingsSchema),
    defaultValues: initial,
  });

  async function onSubmit(values: Values) {
    setMessage(null);
    try {
      await fetchJson('/api/organization', { method: 'PATCH', json: values });
      setMessage({ ok: true, text: 'Saved. Reports issued from now on carry these details.' });
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        for (const e of err.errors) setError(e.path as keyof Values, { message: e.message });
      } else setMessage({ ok: false, text: (err as Error).message });
    }
  }

  const jurisdictionError = errors.defaultJurisdiction?.message;
  return (
    <form onSubmit={handleSubmit(onSubmit)} className="card max-w-2xl space-y-5 p-6" noValidate>
      <fieldset disabled={!editable} className="space-y-5">
        <Field id="company-name" label="Company name" autoComplete="organization" registration={register('name')} error={errors.name?.message} />
        <Field id="company-address" label="Address (optional)" autoComplete="street-address" registration={register('address')} error={errors.address?.message} />
        <Field id="company-phone" label="Phone (optional)" type="tel" autoComplete="tel" registration={register('phone')} error={errors.phone?.message} />
        <Field id="company-license" label="Contractor licence number (optional)" registration={register('licenseNumber')} error={errors.licenseNumber?.message}
          hint="Printed on every report, on the web and in the PDF." />
        <div>
          <label htmlFor="company-jurisdiction" className="field-label">Default jurisdiction (optional)</label>
          <p id="company-jurisdiction-hint" className="text-xs text-ink-faint">Preselected for new projects; each project can still choose another.</p>
          <select id="company-jurisdiction" className="field-input" {...register('defaultJurisdiction')}
            aria-invalid={jurisdictionError ? true : undefined}
            aria-describedby={jurisdictionError ? 'company-jurisdiction-hint company-jurisdiction-error' : 'company-jurisdiction-hint'}>
            <option value="">None</option>
            {jurisdictions.map((j) => <option key={j.slug} value={j.slug}>{j.name}</option>)}
          </select>
          {jurisdictionError && <p id="company-jurisdiction-error" className="field-error" role="alert">{jurisdictionError}</p>}
        </div>
      </fieldset>
      {message && <FormAlert tone={message.ok ? 'pass' : 'fail'}>{message.text}</FormAlert>}
      {editable && <button type="submit" className="btn-primary" disabled={isSubmitting}>{isSubmitting ? 'Saving…' : 'Save company details'}</button>}
    </form>
  );
}
