'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { invitationSchema, invitedRoleLabels, INVITATION_LIFETIME_DAYS, type InvitationInput, type InvitedRole } from '@/lib/domain/accounts/people';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

type Jurisdiction = { slug: string; name: string };

/** Sends an invitation; `roles` are the roles this page may invite (an owner's company roles, or an admin's). */
export function InviteForm({ roles, jurisdictions = [] }: { roles: readonly InvitedRole[]; jurisdictions?: Jurisdiction[] }) {
  const router = useRouter();
  const [sent, setSent] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    control,
    formState: { errors, isSubmitting },
  } = useForm<InvitationInput>({ resolver: zodResolver(invitationSchema), defaultValues: { email: '', role: roles[0], jurisdiction: undefined } });
  const role = useWatch({ control, name: 'role' });

  async function onSubmit(values: InvitationInput) {
    setFormError(null);
    setSent(null);
    const body = { ...values, jurisdiction: values.role === 'inspector' ? values.jurisdiction : undefined };
    try {
      const created = await fetchJson<{ email: string }>('/api/invitations', { method: 'POST', json: body });
      setSent(created.email);
      reset({ email: '', role: values.role, jurisdiction: values.jurisdiction });
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        for (const e of err.errors) setError(e.path as keyof InvitationInput, { message: e.message });
      } else setFormError((err as Error).message);
    }
  }

  const aria = (name: keyof InvitationInput) => ({
    id: `invite-${name}`,
    'aria-invalid': errors[name] ? true : undefined,
    'aria-describedby': errors[name] ? `invite-${name}-error` : undefined,
  });

  return (
    <section aria-labelledby="invite-heading" className="card p-6">
      <h2 id="invite-heading" className="text-lg font-bold">Invite someone</h2>
      <p className="mt-1 text-sm text-ink-soft">
        They get an e-mail with a link that works once, for {INVITATION_LIFETIME_DAYS} days, to choose their password.
      </p>
      <form onSubmit={handleSubmit(onSubmit)} className="mt-4 flex flex-wrap items-start gap-3" noValidate>
        <div className="min-w-[16rem] flex-1">
          <label htmlFor="invite-email" className="field-label">E-mail</label>
          <input {...register('email')} {...aria('email')} type="email" className="field-input" autoComplete="off" />
          {errors.email && <p id="invite-email-error" className="field-error" role="alert">{errors.email.message}</p>}
        </div>
        <div>
          <label htmlFor="invite-role" className="field-label">Role</label>
          <select {...register('role')} {...aria('role')} className="field-input">
            {roles.map((r) => <option key={r} value={r}>{invitedRoleLabels[r]}</option>)}
          </select>
          {errors.role && <p id="invite-role-error" className="field-error" role="alert">{errors.role.message}</p>}
        </div>
        {role === 'inspector' && (
          <div>
            <label htmlFor="invite-jurisdiction" className="field-label">Jurisdiction</label>
            <select {...register('jurisdiction')} {...aria('jurisdiction')} className="field-input">
              <option value="">Choose…</option>
              {jurisdictions.map((j) => <option key={j.slug} value={j.slug}>{j.name}</option>)}
            </select>
            {errors.jurisdiction && <p id="invite-jurisdiction-error" className="field-error" role="alert">{errors.jurisdiction.message}</p>}
          </div>
        )}
        <div className="pt-6">
          <button type="submit" className="btn-primary" disabled={isSubmitting}>{isSubmitting ? 'Sending…' : 'Send invitation'}</button>
        </div>
      </form>
      {sent && <p role="status" className="mt-3 text-sm text-status-pass" data-testid="invite-sent">Invitation sent to {sent}.</p>}
      {formError && <p role="alert" className="mt-3 text-sm text-status-fail">{formError}</p>}
    </section>
  );
}
