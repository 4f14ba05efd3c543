import 'server-only';
import type { DB } from '@/db';
import {
  claimOutboxMail,
  findOutboxMail,
  insertOutboxMail,
  listMailOfReports,
  listOverdueMail,
  markOutboxAttemptFailed,
  markOutboxSent,
  requeueFailedMail,
  type NewOutboxMail,
} from '@/db/mail-outbox';
import { findInvitationById } from '@/db/invitations';
import { findReportById } from '@/db/reports';
import { ConflictError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import type { OutboxMail } from '@/lib/domain/mail/outbox';
import type { AppUser } from '@/lib/domain/roles';
import { enqueue, type JobQueue, positiveIntSetting } from '@/lib/platform/jobs/boss';
import { log } from '@/lib/platform/log';
import { sendMail } from '@/lib/platform/mail';
import { findObject } from '@/lib/platform/storage';
import { assertCanReadReport } from '@/lib/services/reports/access';

/*
 * Every e-mail goes through the outbox: the change that causes it records the message in its own transaction
 * and answers at once; a job delivers it, retried with backoff; "send again" re-queues one that ran out of
 * attempts. A message is claimed by one conditional UPDATE before it is sent, so however many workers run
 * (two app servers, a retried or duplicated job) it reaches the relay once.
 */


export function mailDeliveryConfig() {
  return {
    /** First attempt plus retries; retries wait retryDelaySeconds × 1–2, then ×2–4, … (pg-boss retryBackoff). */
    maxAttempts: Math.min(20, positiveIntSetting(process.env.NOOKPASS_MAIL_ATTEMPTS, 6)),
    retryDelaySeconds: positiveIntSetting(process.env.NOOKPASS_MAIL_RETRY_DELAY_SECONDS, 30),
    /** A claim older than this belongs to a sender that died (an SMTP exchange times out within 25 s). */
    staleClaimSeconds: 300,
    /** A waiting message this far past its due time has lost its job: the periodic pass queues it again. */
    overdueGraceSeconds: positiveIntSetting(process.env.NOOKPASS_MAIL_OVERDUE_SECONDS, 60),
    pollingIntervalSeconds: Number(process.env.NOOKPASS_JOB_POLL_SECONDS ?? 1) || 1,
  };
}

export const MAIL_QUEUE: JobQueue = {
  name: 'mail-deliver',
  retryLimit: mailDeliveryConfig().maxAttempts - 1,
  retryDelaySeconds: mailDeliveryConfig().retryDelaySeconds,
  expireInSeconds: 120,
};

export const MAIL_SWEEP_QUEUE: JobQueue = { name: 'mail-sweep', retryLimit: 0, retryDelaySeconds: 60, expireInSeconds: 120 };

export type QueuedMail = Omit<NewOutboxMail, 'maxAttempts'>;

/** Records a message; call inside the transaction of the change that causes it, then dispatchMail after the commit. */
export async function queueMail(db: DB, mail: QueuedMail): Promise<OutboxMail> {
  return insertOutboxMail(db, { ...mail, maxAttempts: mailDeliveryConfig().maxAttempts });
}

/**
 * Hands recorded messages to the job queue. A failure here loses nothing: the message is on record as queued,
 * and the periodic pass queues it again once it is overdue.
 */
export async function dispatchMail(mails: Array<Pick<OutboxMail, 'id'>>): Promise<void> {
  for (const m of mails) {
    try {
      await enqueue(MAIL_QUEUE, { outboxId: m.id });
    } catch (err) {
      log.error({ err, outboxId: m.id }, 'mail recorded but not yet queued; the periodic pass will queue it');
    }
  }
}

/** The latest moment the next attempt can start after `attempts` failed ones (pg-boss: delay × 2^n / 2 × (1 + random)). */
function nextAttemptWithinSeconds(attempts: number): number {
  return mailDeliveryConfig().retryDelaySeconds * 2 ** Math.min(16, attempts);
}

export class MailAttemptFailed extends Error {}

/**
 * One delivery attempt of one message, as the job runs it. Returns what happened; throws MailAttemptFailed
 * when the job should be retried.
 */
export async function deliverOutboxMail(db: DB, outboxId: string, job: { lastTry: boolean }): Promise<'sent' | 'not-claimed' | 'failed'> {
  const cfg = mailDeliveryConfig();
  const mail = await claimOutboxMail(db, outboxId, cfg.staleClaimSeconds);
  if (!mail) return 'not-claimed';
  try {
    const attachments = [];
    for (const a of mail.attachments) {
      const content = await findObject(a.objectKey);
      if (!content) throw new Error(`The attachment ${a.filename} is no longer stored.`);
      attachments.push({ filename: a.filename, content, contentType: a.contentType });
    }
    const { messageId } = await sendMail({ to: mail.to, replyTo: mail.replyTo ?? undefined, subject: mail.subject, text: mail.text, attachments });
    await markOutboxSent(db, mail.id, messageId);
    log.info({ outboxId: mail.id, kind: mail.kind, attempt: mail.attempts }, 'mail sent');
    return 'sent';
  } catch (err) {
    // A relay that refused the address will refuse it again: no retry, the sender sees why.
    const permanent = err instanceof ValidationError;
    const message = permanent ? err.errors.map((e) => e.message).join(' ') : err instanceof Error ? err.message : String(err);
    const status = await markOutboxAttemptFailed(db, mail.id, message, nextAttemptWithinSeconds(mail.attempts), permanent || job.lastTry);
    log.warn({ outboxId: mail.id, kind: mail.kind, attempt: mail.attempts, status }, 'mail attempt failed');
    if (status === 'retrying') throw new MailAttemptFailed(message);
    return 'failed';
  }
}

/** The periodic pass: queues again every message whose job was lost. */
export async function requeueOverdueMail(db: DB): Promise<number> {
  const cfg = mailDeliveryConfig();
  const ids = await listOverdueMail(db, cfg.overdueGraceSeconds, cfg.staleClaimSeconds, 500);
  await dispatchMail(ids.map((id) => ({ id })));
  if (ids.length) log.info({ count: ids.length }, 'overdue mail queued again');
  return ids.length;
}

/** Who may see a message's state and send it again: whoever can read what it is about. */
async function assertMayHandleMail(db: DB, actor: AppUser, mail: OutboxMail): Promise<void> {
  if (mail.reportId) {
    const report = await findReportById(db, mail.reportId);
    if (report) {
      await assertCanReadReport(db, actor, report);
      return;
    }
  } else if (mail.invitationId) {
    const invitation = await findInvitationById(db, mail.invitationId);
    const mine =
      invitation &&
      (actor.role === 'admin'
        ? invitation.organizationId === null
        : actor.role === 'installer' && actor.isOwner && invitation.organizationId === actor.organizationId);
    if (mine) return;
  } else if (mail.userId && mail.userId === actor.id) {
    return;
  }
  throw new NotFoundError('No such message was sent from here.');
}

/** "Send again": a message that failed its last attempt goes back in the queue with a fresh set of attempts. */
export async function sendMailAgain(db: DB, actor: AppUser, outboxId: string): Promise<OutboxMail> {
  const mail = await findOutboxMail(db, outboxId);
  if (!mail) throw new NotFoundError('No such message was sent from here.');
  await assertMayHandleMail(db, actor, mail);
  if (mail.status === 'sent') throw new ConflictError(`The message to ${mail.to} was already sent.`);
  if (mail.status !== 'failed') throw new ConflictError(`The message to ${mail.to} is still being tried; it can be sent again after its last attempt.`);
  const requeued = await requeueFailedMail(db, outboxId);
  if (!requeued) throw new ConflictError(`The message to ${mail.to} was sent again meanwhile.`);
  await dispatchMail([requeued]);
  return requeued;
}

/** One message's state, for whoever may see it. */
export async function getMailState(db: DB, actor: AppUser, outboxId: string): Promise<OutboxMail> {
  const mail = await findOutboxMail(db, outboxId);
  if (!mail) throw new NotFoundError('No such message was sent from here.');
  await assertMayHandleMail(db, actor, mail);
  return mail;
}

/** The e-mails about reports the caller has already been allowed to read (a project's sends, a report's outcomes). */
export async function listMailOfReadableReports(db: DB, reportIds: string[]): Promise<OutboxMail[]> {
  return listMailOfReports(db, reportIds);
}
