import { z } from 'zod';
import { newPasswordSchema } from '@/lib/domain/accounts/password-policy';

/** How long an invitation link works (common practice, no published source). */
export const INVITATION_LIFETIME_DAYS = 7;

/** Who can be invited: an owner invites into their company, an admin invites inspectors and admins. */
export const invitedRoles = ['installer', 'owner', 'inspector', 'admin'] as const;
export type InvitedRole = (typeof invitedRoles)[number];

export const companyRoles = ['installer', 'owner'] as const;
export type CompanyRole = (typeof companyRoles)[number];

export const invitedRoleLabels: Record<InvitedRole, string> = {
  installer: 'Installer',
  owner: 'Owner (manages the company)',
  inspector: 'Inspector',
  admin: 'Administrator',
};

const email = z
  .string('Give the e-mail address of the person to invite.')
  .trim()
  .toLowerCase()
  .max(254, 'An e-mail address has at most 254 characters.')
  .pipe(z.email('Give an e-mail address, e.g. teammate@example.com.'));

const slug = z.string().trim().min(1, 'Choose the jurisdiction the inspector works for.').max(100, 'A jurisdiction slug has at most 100 characters.');

export const invitationSchema = z.strictObject({
  email,
  role: z.enum(invitedRoles, 'Choose a role: installer, owner, inspector or admin.'),
  jurisdiction: slug.optional().describe('Jurisdiction slug; required for an inspector'),
});
export type InvitationInput = z.input<typeof invitationSchema>;

export const acceptInvitationSchema = z.strictObject({
  name: z.string('Give your name.').trim().min(1, 'Give your name.').max(120, 'A name has at most 120 characters.'),
  // The rule that it is not the e-mail is checked by the service, which knows the invitation's e-mail.
  password: newPasswordSchema,
});
export type AcceptInvitationInput = z.input<typeof acceptInvitationSchema>;

export const personUpdateSchema = z
  .strictObject({
    role: z.enum(companyRoles, 'A company role is "installer" or "owner".').optional(),
    active: z.boolean('Say true to reactivate or false to deactivate.').optional(),
    jurisdiction: slug.optional().describe("Jurisdiction slug; an inspector's only"),
  })
  .refine((v) => v.role !== undefined || v.active !== undefined || v.jurisdiction !== undefined, {
    message: 'Say what to change: role, active or jurisdiction.',
    path: ['role'],
  });
export type PersonUpdate = z.output<typeof personUpdateSchema>;

/** Where an invitation stands; anything but pending can no longer be accepted. */
export type InvitationState = 'pending' | 'accepted' | 'revoked' | 'expired';

export function invitationState(i: { acceptedAt: Date | null; revokedAt: Date | null; expiresAt: Date }, now = new Date()): InvitationState {
  if (i.acceptedAt) return 'accepted';
  if (i.revokedAt) return 'revoked';
  if (i.expiresAt.getTime() <= now.getTime()) return 'expired';
  return 'pending';
}

/** What a person holding a link that no longer works reads, and what to do next. */
export function invitationStateMessage(state: Exclude<InvitationState, 'pending'>): { title: string; next: string } {
  switch (state) {
    case 'accepted':
      return { title: 'This invitation has already been used.', next: 'If you accepted it, sign in with the e-mail address it was sent to. If you forgot the password, reset it from the sign-in page.' };
    case 'revoked':
      return { title: 'This invitation was withdrawn by the person who sent it.', next: 'Ask them to send you a new invitation if you should still join.' };
    case 'expired':
      return { title: `This invitation has expired (invitations work for ${INVITATION_LIFETIME_DAYS} days).`, next: 'Ask the person who invited you to send a new invitation.' };
  }
}

export const accountActionLabels: Record<string, string> = {
  'invitation.send': 'Invitation sent',
  'invitation.accept': 'Invitation accepted',
  'invitation.revoke': 'Invitation revoked',
  'user.role-change': 'Role changed',
  'user.deactivate': 'Deactivated',
  'user.reactivate': 'Reactivated',
  'user.jurisdiction-change': 'Jurisdiction changed',
  'webhook.create': 'Webhook endpoint added',
  'webhook.update': 'Webhook endpoint changed',
  'webhook.rotate-secret': 'Webhook secret rotated',
  'webhook.deactivate': 'Webhook endpoint deactivated',
  'webhook.delete': 'Webhook endpoint removed',
};

const day = z.iso.date('Give a date as YYYY-MM-DD.');

/** The audit page's filters, from the query string. */
export const auditFilterSchema = z.strictObject({
  action: z.string().trim().max(80, 'An action has at most 80 characters.').optional().transform((v) => v || undefined),
  person: z.string().trim().max(254, 'Search for at most 254 characters.').optional().transform((v) => v || undefined),
  from: z.union([z.literal(''), day]).optional().transform((v) => v || undefined),
  to: z.union([z.literal(''), day]).optional().transform((v) => v || undefined),
  limit: z.coerce.number('Give the number of rows, 1 to 500.').int().min(1).max(500).default(200),
});
export type AuditFilterInput = z.output<typeof auditFilterSchema>;

/** The people page's filters, from the query string. */
export const peopleFilterSchema = z.strictObject({
  q: z.string().trim().max(254, 'Search for at most 254 characters.').optional().transform((v) => v || undefined),
  role: z.union([z.literal(''), z.enum(['installer', 'owner', 'inspector', 'admin'], 'Filter by installer, owner, inspector or admin.')]).optional().transform((v) => v || undefined),
  status: z.union([z.literal(''), z.enum(['active', 'deactivated'], 'Filter by active or deactivated.')]).optional().transform((v) => v || undefined),
});
