import 'server-only';
import type { DB } from '@/db';
import type { OutboxMail } from '@/lib/domain/mail/outbox';
import { queueMail } from '@/lib/services/mail/outbox';
import { publicBaseUrl } from '@/lib/services/reports/issue';

export const CONFIRMATION_LIFETIME_SECONDS = 7 * 24 * 3600;
export const PASSWORD_RESET_LIFETIME_SECONDS = 3600;

export function confirmationUrl(token: string): string {
  return `${publicBaseUrl()}/confirm-email/${token}`;
}

export function passwordResetUrl(token: string): string {
  return `${publicBaseUrl()}/reset-password/${token}`;
}

type Recipient = { id: string; email: string; name: string };

// Each queues its message in the caller's transaction; the caller hands it to dispatchMail after the commit.
export async function queueWelcomeMail(db: DB, to: Recipient, company: string, token: string): Promise<OutboxMail> {
  return queueMail(db, {
    kind: 'welcome',
    userId: to.id,
    to: to.email,
    subject: `Welcome to NookPass, ${company}`,
    text: [
      `Hello ${to.name},`,
      '',
      `${company} is set up on NookPass and you are its owner. Plan closets, run checks and download reports right away.`,
      '',
      'Before your company can e-mail reports to inspectors, confirm this address by opening this link (it works for 7 days, once):',
      confirmationUrl(token),
      '',
      'If you did not sign up, ignore this message; nothing is sent to inspectors from an unconfirmed address.',
    ].join('\n'),
  });
}

export async function queueConfirmationMail(db: DB, to: Recipient, token: string): Promise<OutboxMail> {
  return queueMail(db, {
    kind: 'email-confirmation',
    userId: to.id,
    to: to.email,
    subject: 'Confirm your e-mail address for NookPass',
    text: [
      `Hello ${to.name},`,
      '',
      'Open this link to confirm your e-mail address (it works for 7 days, once; a newer link replaces this one):',
      confirmationUrl(token),
      '',
      'Once confirmed, your company can e-mail reports to inspectors.',
    ].join('\n'),
  });
}

export async function queuePasswordResetMail(db: DB, to: Recipient, token: string): Promise<OutboxMail> {
  return queueMail(db, {
    kind: 'password-reset',
    userId: to.id,
    to: to.email,
    subject: 'Reset your NookPass password',
    text: [
      `Hello ${to.name},`,
      '',
      'Someone (we hope you) asked to reset the password of this NookPass account. Open this link within an hour to choose a new one; it works once:',
      passwordResetUrl(token),
      '',
      'Choosing a new password signs you out everywhere else. If you did not ask for this, ignore this message: your password stays as it is.',
    ].join('\n'),
  });
}
