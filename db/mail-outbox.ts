import { sql } from 'kysely';
import type { DB } from '@/db/index';
import { listOverdueOutboxRows } from '@/db/outbox-rows';
import type { MailAttachmentRef, MailOutboxTable } from '@/db/types';
import type { Selectable } from 'kysely';
import { isUuid } from '@/lib/domain/ids';
import type { MailKind, OutboxMail } from '@/lib/domain/mail/outbox';

export type NewOutboxMail = {
  kind: MailKind;
  to: string;
  replyTo?: { name: string; address: string } | string | null;
  subject: string;
  text: string;
  attachments?: MailAttachmentRef[];
  maxAttempts: number;
  reportId?: string | null;
  reportSendId?: string | null;
  reviewId?: string | null;
  invitationId?: string | null;
  userId?: string | null;
  createdBy?: string | null;
};

/** The whole message, for the worker that delivers it. */
export type OutboxMessage = OutboxMail & { replyTo: { name: string; address: string } | string | null; text: string; attachments: MailAttachmentRef[] };

function toMail(r: Selectable<MailOutboxTable>): OutboxMail {
  return {
    id: r.id,
    kind: r.kind,
    to: r.to_email,
    subject: r.subject,
    status: r.status,
    attempts: r.attempts,
    maxAttempts: r.max_attempts,
    lastError: r.last_error,
    messageId: r.message_id,
    createdAt: r.created_at,
    sentAt: r.sent_at,
    nextAttemptAt: r.next_attempt_at,
    reportId: r.report_id,
    reportSendId: r.report_send_id,
    reviewId: r.review_id,
    invitationId: r.invitation_id,
    userId: r.user_id,
  };
}

function toMessage(r: Selectable<MailOutboxTable>): OutboxMessage {
  return { ...toMail(r), replyTo: r.reply_to, text: r.body_text, attachments: r.attachments };
}

/** Records a message to send; call it inside the transaction of the change that causes the message. */
export async function insertOutboxMail(db: DB, m: NewOutboxMail): Promise<OutboxMail> {
  const row = await db
    .insertInto('mail_outbox')
    .values({
      kind: m.kind,
      to_email: m.to,
      reply_to: m.replyTo == null ? null : JSON.stringify(m.replyTo),
      subject: m.subject,
      body_text: m.text,
      attachments: JSON.stringify(m.attachments ?? []),
      max_attempts: m.maxAttempts,
      report_id: m.reportId ?? null,
      report_send_id: m.reportSendId ?? null,
      review_id: m.reviewId ?? null,
      invitation_id: m.invitationId ?? null,
      user_id: m.userId ?? null,
      created_by: m.createdBy ?? null,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
  return toMail(row);
}

export async function findOutboxMail(db: DB, id: string): Promise<OutboxMail | null> {
  if (!isUuid(id)) return null;
  const row = await db.selectFrom('mail_outbox').selectAll().where('id', '=', id).executeTakeFirst();
  return row ? toMail(row) : null;
}

/**
 * Takes the message for one delivery attempt. Only one caller wins: the row must be waiting (queued or
 * retrying), or claimed so long ago that its sender must have died. Anyone else gets null and sends nothing.
 */
export async function claimOutboxMail(db: DB, id: string, staleClaimSeconds: number): Promise<OutboxMessage | null> {
  const row = await db
    .updateTable('mail_outbox')
    .set({ status: 'sending', attempts: sql<number>`attempts + 1`, claimed_at: sql<Date>`now()`, updated_at: sql<Date>`now()` })
    .where('id', '=', id)
    .where((eb) =>
      eb.or([
        eb('status', 'in', ['queued', 'retrying']),
        eb.and([eb('status', '=', 'sending'), eb('claimed_at', '<', sql<Date>`now() - make_interval(secs => ${staleClaimSeconds})`)]),
      ]),
    )
    .returningAll()
    .executeTakeFirst();
  return row ? toMessage(row) : null;
}

export async function markOutboxSent(db: DB, id: string, messageId: string): Promise<void> {
  await db
    .updateTable('mail_outbox')
    .set({ status: 'sent', message_id: messageId, sent_at: sql<Date>`now()`, last_error: null, claimed_at: null, updated_at: sql<Date>`now()` })
    .where('id', '=', id)
    .where('status', '=', 'sending')
    .execute();
}

/**
 * Records a failed attempt: "retrying" while attempts remain (retryAfterSeconds is the latest the next one is
 * due), "failed" after the last. Returns the status written.
 */
export async function markOutboxAttemptFailed(db: DB, id: string, error: string, retryAfterSeconds: number, final: boolean): Promise<'retrying' | 'failed' | null> {
  const row = await db
    .updateTable('mail_outbox')
    .set({
      status: final ? 'failed' : sql<'retrying' | 'failed'>`CASE WHEN attempts >= max_attempts THEN 'failed' ELSE 'retrying' END`,
      last_error: error.slice(0, 1000),
      claimed_at: null,
      next_attempt_at: sql<Date>`now() + make_interval(secs => ${retryAfterSeconds})`,
      updated_at: sql<Date>`now()`,
    })
    .where('id', '=', id)
    .where('status', '=', 'sending')
    .returning('status')
    .executeTakeFirst();
  return (row?.status as 'retrying' | 'failed' | undefined) ?? null;
}

/** Puts a message that failed its last attempt back in the queue with a fresh set of attempts. */
export async function requeueFailedMail(db: DB, id: string): Promise<OutboxMail | null> {
  const row = await db
    .updateTable('mail_outbox')
    .set({ status: 'queued', attempts: 0, next_attempt_at: sql<Date>`now()`, claimed_at: null, updated_at: sql<Date>`now()` })
    .where('id', '=', id)
    .where('status', '=', 'failed')
    .returningAll()
    .executeTakeFirst();
  return row ? toMail(row) : null;
}

/** Messages whose job must have been lost (see listOverdueOutboxRows). */
export function listOverdueMail(db: DB, graceSeconds: number, staleClaimSeconds: number, limit: number): Promise<string[]> {
  return listOverdueOutboxRows(db, 'mail_outbox', graceSeconds, staleClaimSeconds, limit);
}

/** Every message about a report (its sends, the outcomes on it, answers to corrections), oldest first. */
export async function listMailOfReports(db: DB, reportIds: string[]): Promise<OutboxMail[]> {
  if (reportIds.length === 0) return [];
  const rows = await db.selectFrom('mail_outbox').selectAll().where('report_id', 'in', reportIds).orderBy('created_at').execute();
  return rows.map(toMail);
}

/** The latest message of each invitation. */
export async function listMailOfInvitations(db: DB, invitationIds: string[]): Promise<OutboxMail[]> {
  if (invitationIds.length === 0) return [];
  const rows = await db
    .selectFrom('mail_outbox')
    .selectAll()
    .distinctOn('invitation_id')
    .where('invitation_id', 'in', invitationIds)
    .orderBy('invitation_id')
    .orderBy('created_at', 'desc')
    .execute();
  return rows.map(toMail);
}

/** The latest account message (welcome, confirmation, reset) to a user. */
export async function findLatestAccountMail(db: DB, userId: string): Promise<OutboxMail | null> {
  const row = await db
    .selectFrom('mail_outbox')
    .selectAll()
    .where('user_id', '=', userId)
    .where('kind', 'in', ['welcome', 'email-confirmation', 'password-reset'])
    .orderBy('created_at', 'desc')
    .limit(1)
    .executeTakeFirst();
  return row ? toMail(row) : null;
}

/** Counts by status, for the bench and health figures. */
export async function countOutboxByStatus(db: DB): Promise<Record<string, number>> {
  const rows = await db.selectFrom('mail_outbox').select(['status', (eb) => eb.fn.countAll<number>().as('n')]).groupBy('status').execute();
  return Object.fromEntries(rows.map((r) => [r.status, Number(r.n)]));
}
