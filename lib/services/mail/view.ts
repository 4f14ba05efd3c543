import { mailState, type OutboxMail } from '@/lib/domain/mail/outbox';

/** A message's state as the API answers it (the same words the pages show). */
export function mailStateBody(m: OutboxMail) {
  const state = mailState(m);
  return {
    id: m.id,
    kind: m.kind,
    to: m.to,
    subject: m.subject,
    status: m.status,
    attempts: m.attempts,
    maxAttempts: m.maxAttempts,
    lastError: m.lastError,
    createdAt: m.createdAt,
    sentAt: m.sentAt,
    label: state.label,
    canSendAgain: state.canSendAgain,
  };
}
