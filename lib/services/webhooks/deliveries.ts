import 'server-only';
import { randomUUID } from 'node:crypto';
import type { DB } from '@/db';
import {
  claimWebhookDelivery,
  insertWebhookDeliveries,
  listOverdueWebhookDeliveries,
  listSubscribedEndpointIds,
  markWebhookAttemptFailed,
  markWebhookDelivered,
} from '@/db/webhooks';
import { webhookPayload, type OutcomeRecordedData, type ReportSentData, type WebhookEvent } from '@/lib/domain/webhooks/events';
import { enqueue, type JobQueue, positiveIntSetting } from '@/lib/platform/jobs/boss';
import { log } from '@/lib/platform/log';
import { postWebhook } from '@/lib/platform/webhooks/post';
import { EVENT_ID_HEADER, EVENT_TYPE_HEADER, SIGNATURE_HEADER, signWebhookBody } from '@/lib/platform/webhooks/signature';

/*
 * Webhook deliveries go the way e-mail does: the change that causes an event records one delivery per
 * subscribed endpoint in its own transaction, a job posts each after the commit, retried with backoff, and
 * "send again" re-queues one that ran out of attempts. A delivery is claimed by a conditional UPDATE before
 * it is posted, so however many workers run it is posted once per attempt. Receivers may still see an event
 * twice (an answer lost on the way back): the event id is the same each time, for them to ignore repeats.
 */


export function webhookDeliveryConfig() {
  return {
    /** First attempt plus retries; retries wait retryDelaySeconds × 1–2, then ×2–4, … (pg-boss retryBackoff). */
    maxAttempts: Math.min(20, positiveIntSetting(process.env.NOOKPASS_WEBHOOK_ATTEMPTS, 8)),
    retryDelaySeconds: positiveIntSetting(process.env.NOOKPASS_WEBHOOK_RETRY_DELAY_SECONDS, 30),
    /** A claim older than this belongs to a worker that died (an attempt ends within 10 s). */
    staleClaimSeconds: 60,
    /** A waiting delivery this far past its due time has lost its job: the periodic pass queues it again. */
    overdueGraceSeconds: positiveIntSetting(process.env.NOOKPASS_WEBHOOK_OVERDUE_SECONDS, 60),
    pollingIntervalSeconds: Number(process.env.NOOKPASS_JOB_POLL_SECONDS ?? 1) || 1,
  };
}

export const WEBHOOK_QUEUE: JobQueue = {
  name: 'webhook-deliver',
  retryLimit: webhookDeliveryConfig().maxAttempts - 1,
  retryDelaySeconds: webhookDeliveryConfig().retryDelaySeconds,
  expireInSeconds: 60,
};

export const WEBHOOK_SWEEP_QUEUE: JobQueue = { name: 'webhook-sweep', retryLimit: 0, retryDelaySeconds: 60, expireInSeconds: 120 };

type NewEvent = { type: 'report.sent'; data: ReportSentData } | { type: 'inspection.outcome_recorded'; data: OutcomeRecordedData };

/**
 * Records the event for each active endpoint of the company subscribed to it. Call inside the transaction of
 * the change that causes it, then dispatchWebhookDeliveries after the commit. Returns the delivery ids.
 */
export async function queueWebhookEvent(trx: DB, organizationId: string, event: NewEvent & { occurredAt?: Date }): Promise<string[]> {
  const endpointIds = await listSubscribedEndpointIds(trx, organizationId, event.type);
  if (endpointIds.length === 0) return [];
  const payload = webhookPayload({ id: randomUUID(), type: event.type, occurredAt: (event.occurredAt ?? new Date()).toISOString(), data: event.data } as WebhookEvent);
  const { maxAttempts } = webhookDeliveryConfig();
  return insertWebhookDeliveries(
    trx,
    endpointIds.map((endpointId) => ({ endpointId, eventId: payload.id, eventType: payload.type, payload, maxAttempts })),
  );
}

/**
 * Hands recorded deliveries to the job queue. A failure here loses nothing: the delivery is on record as
 * queued, and the periodic pass queues it again once it is overdue.
 */
export async function dispatchWebhookDeliveries(ids: string[]): Promise<void> {
  for (const id of ids) {
    try {
      await enqueue(WEBHOOK_QUEUE, { deliveryId: id });
    } catch (err) {
      log.error({ err, deliveryId: id }, 'webhook delivery recorded but not yet queued; the periodic pass will queue it');
    }
  }
}

/** The latest moment the next attempt can start after `attempts` failed ones (pg-boss: delay × 2^n / 2 × (1 + random)). */
function nextAttemptWithinSeconds(attempts: number): number {
  return webhookDeliveryConfig().retryDelaySeconds * 2 ** Math.min(16, attempts);
}

export class WebhookAttemptFailed extends Error {}

/**
 * One attempt of one delivery, as the job runs it: sign the body with the endpoint's secret as it stands now,
 * post it, record the answer. Throws WebhookAttemptFailed when the job should be retried.
 */
export async function deliverWebhook(db: DB, deliveryId: string, job: { lastTry: boolean }): Promise<'delivered' | 'not-claimed' | 'failed'> {
  const cfg = webhookDeliveryConfig();
  const delivery = await claimWebhookDelivery(db, deliveryId, cfg.staleClaimSeconds);
  if (!delivery) return 'not-claimed';
  if (!delivery.endpointActive) {
    await markWebhookAttemptFailed(db, delivery.id, { responseStatus: null, error: 'The endpoint was deactivated; nothing was sent.', retryAfterSeconds: 0, final: true });
    return 'failed';
  }
  const body = JSON.stringify(delivery.payload);
  const timestamp = Math.floor(Date.now() / 1000);
  const result = await postWebhook(delivery.url, body, {
    [SIGNATURE_HEADER]: signWebhookBody(delivery.secret, body, timestamp),
    [EVENT_ID_HEADER]: delivery.eventId,
    [EVENT_TYPE_HEADER]: delivery.eventType,
  });
  if (result.ok) {
    await markWebhookDelivered(db, delivery.id, result.status);
    log.info({ deliveryId: delivery.id, eventType: delivery.eventType, attempt: delivery.attempts, status: result.status }, 'webhook delivered');
    return 'delivered';
  }
  const status = await markWebhookAttemptFailed(db, delivery.id, {
    responseStatus: result.status,
    error: result.error,
    retryAfterSeconds: nextAttemptWithinSeconds(delivery.attempts),
    final: job.lastTry,
  });
  log.warn({ deliveryId: delivery.id, eventType: delivery.eventType, attempt: delivery.attempts, responseStatus: result.status, status }, 'webhook attempt failed');
  if (status === 'retrying') throw new WebhookAttemptFailed(result.error);
  return 'failed';
}

/** The periodic pass: queues again every delivery whose job was lost. */
export async function requeueOverdueWebhooks(db: DB): Promise<number> {
  const cfg = webhookDeliveryConfig();
  const ids = await listOverdueWebhookDeliveries(db, cfg.overdueGraceSeconds, cfg.staleClaimSeconds, 500);
  await dispatchWebhookDeliveries(ids);
  if (ids.length) log.info({ count: ids.length }, 'overdue webhook deliveries queued again');
  return ids.length;
}
