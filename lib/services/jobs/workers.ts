import 'server-only';
import { getDb } from '@/db';
import { schedule, stopJobs, work } from '@/lib/platform/jobs/boss';
import { log } from '@/lib/platform/log';
import { STORAGE_SWEEP_QUEUE, sweepUnreferencedObjects } from '@/lib/services/storage-sweep';
import { executeRuleSetRun, requeueStalledRuns, RULE_SET_RUN_QUEUE, RULE_SET_RUN_SWEEP_QUEUE, ruleSetRunConfig } from '@/lib/services/rule-sets/runs';
import { DERIVATIVES_QUEUE, DERIVATIVES_SWEEP_QUEUE, derivativesConfig, makeAttachmentDerivatives, requeueStalledDerivatives } from '@/lib/services/attachments/derivatives';
import { deliverOutboxMail, MAIL_QUEUE, MAIL_SWEEP_QUEUE, mailDeliveryConfig, requeueOverdueMail } from '@/lib/services/mail/outbox';
import { deliverWebhook, requeueOverdueWebhooks, WEBHOOK_QUEUE, WEBHOOK_SWEEP_QUEUE } from '@/lib/services/webhooks/deliveries';

const g = globalThis as unknown as { nookpassWorkers?: Promise<void> };

/**
 * Starts this process's workers: every app server runs them, and the queue gives each job to one of them.
 * Set NOOKPASS_WORKERS=0 for a server that should only answer requests.
 */
export function startWorkers(): Promise<void> {
  g.nookpassWorkers ??= (async () => {
    const db = getDb();
    const { pollingIntervalSeconds } = mailDeliveryConfig();
    await work<{ outboxId: string }>(MAIL_QUEUE, { concurrency: 2, pollingIntervalSeconds }, async (job) => {
      // retryCount counts the retries already started; the last one has no retry after it.
      return deliverOutboxMail(db, job.data.outboxId, { lastTry: job.retryCount >= job.retryLimit });
    });
    await work(MAIL_SWEEP_QUEUE, { pollingIntervalSeconds: 10 }, async () => requeueOverdueMail(db));
    // Every minute (the finest a cron schedule goes); pg-boss sends one job per tick for all servers together.
    await schedule(MAIL_SWEEP_QUEUE, '* * * * *');
    await work<{ minAgeSeconds?: number }>(STORAGE_SWEEP_QUEUE, { pollingIntervalSeconds: 30 }, async (job) => {
      const { examined, deleted } = await sweepUnreferencedObjects(db, { minAgeSeconds: typeof job.data?.minAgeSeconds === 'number' ? job.data.minAgeSeconds : undefined });
      return { examined, deleted: deleted.length };
    });
    // Nightly at 03:15 UTC, when few people upload.
    await schedule(STORAGE_SWEEP_QUEUE, '15 3 * * *');
    // Webhooks: one signed POST per attempt, retried like mail; a pass every minute re-queues lost deliveries.
    await work<{ deliveryId: string }>(WEBHOOK_QUEUE, { concurrency: 2, pollingIntervalSeconds }, async (job) =>
      deliverWebhook(db, job.data.deliveryId, { lastTry: job.retryCount >= job.retryLimit }),
    );
    await work(WEBHOOK_SWEEP_QUEUE, { pollingIntervalSeconds: 10 }, async () => requeueOverdueWebhooks(db));
    await schedule(WEBHOOK_SWEEP_QUEUE, '* * * * *');
    // Impact and dry runs: one at a time per server, so evaluations never crowd out the requests it answers.
    await work<{ runId: string }>(RULE_SET_RUN_QUEUE, { pollingIntervalSeconds: ruleSetRunConfig().pollingIntervalSeconds }, async (job) =>
      executeRuleSetRun(db, job.data.runId, { lastTry: job.retryCount >= job.retryLimit }),
    );
    // A photo's thumbnail, report-size image and copy without metadata, after the upload has answered.
    await work<{ attachmentId: string }>(DERIVATIVES_QUEUE, { concurrency: 1, pollingIntervalSeconds: derivativesConfig().pollingIntervalSeconds }, async (job) => {
      return { result: await makeAttachmentDerivatives(db, job.data.attachmentId, { lastTry: job.retryCount >= job.retryLimit }) };
    });
    // Every minute, work that stalled (its server stopped mid-job, its job lost) goes back in the queue or is ended.
    await work(DERIVATIVES_SWEEP_QUEUE, { pollingIntervalSeconds: 10 }, async () => requeueStalledDerivatives(db));
    await schedule(DERIVATIVES_SWEEP_QUEUE, '* * * * *');
    await work(RULE_SET_RUN_SWEEP_QUEUE, { pollingIntervalSeconds: 10 }, async () => requeueStalledRuns(db));
    await schedule(RULE_SET_RUN_SWEEP_QUEUE, '* * * * *');
    log.info('job workers started');
  })().catch((err) => {
    g.nookpassWorkers = undefined;
    throw err;
  });
  return g.nookpassWorkers;
}

/** Starts the workers, trying again every few seconds while the database is not reachable yet. */
export function startWorkersInBackground(retryMs = 5_000): void {
  let stopped = false;
  const attempt = () => {
    if (stopped) return;
    startWorkers().catch((err) => {
      log.error({ err }, 'job workers not started; trying again');
      setTimeout(attempt, retryMs).unref();
    });
  };
  attempt();
  const stop = () => {
    stopped = true;
    void stopJobs();
  };
  process.once('SIGTERM', stop);
  process.once('SIGINT', stop);
}
