import 'server-only';
import { sendMail } from '@/lib/platform/mail';
import { publicBaseUrl } from '@/lib/services/reports/issue';

export const CONFIRMATION_LIFETIME_SECONDS = 7 * 24 * 3600;
export const PASSWORD_RESET_LIFETIME_SECONDS = 3600;

export function confirmationUrl(token: string): string {
  return `${publicBaseUrl()}/confirm-email/${token}`;
}

export function passwordResetUrl(token: string): string {
  return `${publicBaseUrl()}/reset-password/${token}`;
}

export async function sendWelcomeMail(to: { email: string; name: string }, company: string, token: string): Promise<void> {
  await sendMail({
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

export async function sendConfirmationMail(to: { email: string; name: string }, token: string): Promise<void> {
  await sendMail({
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

export async function sendPasswordResetMail(to: { email: string; name: string }, token: string): Promise<void> {
  await sendMail({
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
