/**
 * Webhooks: what a company's endpoint can subscribe to, what each delivery carries, and the words the pages
 * show for a delivery's state. Imports nothing, so client components may use it.
 */

export const WEBHOOK_EVENT_TYPES = ['report.sent', 'inspection.outcome_recorded'] as const;
export type WebhookEventType = (typeof WEBHOOK_EVENT_TYPES)[number];

export const webhookEventLabels: Record<WebhookEventType, string> = {
  'report.sent': 'Report sent to the inspector',
  'inspection.outcome_recorded': 'Inspection outcome recorded',
};

export type WebhookDeliveryStatus = 'queued' | 'sending' | 'retrying' | 'delivered' | 'failed';

/** The project, report and jurisdiction every event names; the receiver's own records key on the project id. */
type EventSubject = {
  project: { id: string; name: string };
  report: { code: string; verifyUrl: string };
  jurisdiction: { slug: string; name: string };
};

export type ReportSentData = EventSubject & {
  /** True when it went to the jurisdiction's inspector address (and so to the inspector's queue). */
  toInspector: boolean;
};

export type OutcomeRecordedData = EventSubject & {
  outcome: 'approved' | 'corrections-needed';
  inspector: { name: string };
  /** The outcome replaces one recorded before. */
  revised: boolean;
  /** Recorded on the installer's answer to corrections rather than on the report as first sent. */
  onAnswer: boolean;
};

export type WebhookEvent =
  | { id: string; type: 'report.sent'; occurredAt: string; data: ReportSentData }
  | { id: string; type: 'inspection.outcome_recorded'; occurredAt: string; data: OutcomeRecordedData };

/** The body a receiver gets: the event itself, nothing else (no secret, no e-mail address). */
export function webhookPayload(event: WebhookEvent): WebhookEvent {
  return { id: event.id, type: event.type, occurredAt: event.occurredAt, data: event.data } as WebhookEvent;
}

export type WebhookDeliveryStateView = { label: string; tone: 'pending' | 'done' | 'problem'; canSendAgain: boolean };

/** The words shown beside a delivery: queued → delivered, or failed, retrying (n), and after the last attempt "failed". */
export function webhookDeliveryState(d: { status: WebhookDeliveryStatus; attempts: number; maxAttempts: number }): WebhookDeliveryStateView {
  switch (d.status) {
    case 'delivered':
      return { label: 'delivered', tone: 'done', canSendAgain: false };
    case 'queued':
      return { label: 'queued', tone: 'pending', canSendAgain: false };
    case 'sending':
      return { label: d.attempts > 1 ? `sending (attempt ${d.attempts})` : 'sending', tone: 'pending', canSendAgain: false };
    case 'retrying':
      return { label: `failed, retrying (${d.attempts} of ${d.maxAttempts} attempts made)`, tone: 'problem', canSendAgain: false };
    case 'failed':
      return { label: `failed after ${d.attempts} attempt${d.attempts === 1 ? '' : 's'}`, tone: 'problem', canSendAgain: true };
  }
}
