/** An e-mail on its way out, as the pages and the API show it. */
export type MailKind = 'report-send' | 'inspection-outcome' | 'corrections-answer' | 'welcome' | 'email-confirmation' | 'invitation' | 'password-reset';
export type MailStatus = 'queued' | 'sending' | 'retrying' | 'sent' | 'failed';

export type OutboxMail = {
  id: string;
  kind: MailKind;
  to: string;
  subject: string;
  status: MailStatus;
  attempts: number;
  maxAttempts: number;
  lastError: string | null;
  messageId: string | null;
  createdAt: Date;
  sentAt: Date | null;
  nextAttemptAt: Date;
  reportId: string | null;
  reportSendId: string | null;
  reviewId: string | null;
  invitationId: string | null;
  userId: string | null;
};

export type MailStateView = { label: string; tone: 'pending' | 'done' | 'problem'; canSendAgain: boolean };

/** The words shown beside a send: queued → sent, or failed, retrying (n), and after the last attempt "failed". */
export function mailState(m: Pick<OutboxMail, 'status' | 'attempts' | 'maxAttempts' | 'lastError'>): MailStateView {
  switch (m.status) {
    case 'sent':
      return { label: 'sent', tone: 'done', canSendAgain: false };
    case 'queued':
      return { label: 'queued', tone: 'pending', canSendAgain: false };
    case 'sending':
      return { label: m.attempts > 1 ? `sending (attempt ${m.attempts})` : 'sending', tone: 'pending', canSendAgain: false };
    case 'retrying':
      return { label: `failed, retrying (${m.attempts} of ${m.maxAttempts} attempts made)`, tone: 'problem', canSendAgain: false };
    case 'failed':
      return { label: `not sent after ${m.attempts} attempt${m.attempts === 1 ? '' : 's'}`, tone: 'problem', canSendAgain: true };
  }
}

/** Only what a page hands the browser of a message (no body). */
export type MailDeliveryProps = Pick<OutboxMail, 'id' | 'status' | 'attempts' | 'maxAttempts' | 'lastError'>;
export const mailDeliveryProps = (m: MailDeliveryProps): MailDeliveryProps => ({ id: m.id, status: m.status, attempts: m.attempts, maxAttempts: m.maxAttempts, lastError: m.lastError });
