import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// Every e-mail NookPass sends is first a row here, written in the same transaction as the change that causes it;
// a job delivers it. `status` moves queued → sending → sent, or → retrying (attempts so far) → failed after the
// last attempt; "send again" puts a failed row back to queued. A worker claims a row by a conditional UPDATE
// (queued/retrying → sending), so two app servers or a retried job never send one message twice.
// Attachments are references to stored objects (the report PDF's key), never copied into the row.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('mail_outbox')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('kind', 'text', (c) =>
      c.notNull().check(sql`kind IN ('report-send', 'inspection-outcome', 'corrections-answer', 'welcome', 'email-confirmation', 'invitation', 'password-reset')`),
    )
    .addColumn('to_email', 'text', (c) => c.notNull())
    .addColumn('reply_to', 'jsonb')
    .addColumn('subject', 'text', (c) => c.notNull())
    .addColumn('body_text', 'text', (c) => c.notNull())
    // [{ filename, objectKey, contentType }]
    .addColumn('attachments', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('queued').check(sql`status IN ('queued', 'sending', 'retrying', 'sent', 'failed')`))
    .addColumn('attempts', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('max_attempts', 'integer', (c) => c.notNull().check(sql`max_attempts BETWEEN 1 AND 20`))
    .addColumn('last_error', 'text')
    .addColumn('message_id', 'text')
    .addColumn('next_attempt_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('claimed_at', 'timestamptz')
    .addColumn('sent_at', 'timestamptz')
    // What the message is about, so the page where it was sent can show its state.
    .addColumn('report_id', 'uuid', (c) => c.references('reports.id').onDelete('set null'))
    .addColumn('report_send_id', 'uuid', (c) => c.references('report_sends.id').onDelete('set null'))
    .addColumn('review_id', 'uuid', (c) => c.references('inspection_reviews.id').onDelete('set null'))
    .addColumn('invitation_id', 'uuid', (c) => c.references('invitations.id').onDelete('set null'))
    .addColumn('user_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('mail_outbox_report_idx').on('mail_outbox').column('report_id').where(sql.ref('report_id'), 'is not', null).execute();
  await db.schema.createIndex('mail_outbox_invitation_idx').on('mail_outbox').column('invitation_id').where(sql.ref('invitation_id'), 'is not', null).execute();
  // The periodic pass looks only at messages not yet delivered.
  await sql`CREATE INDEX mail_outbox_pending_idx ON mail_outbox (next_attempt_at) WHERE status IN ('queued', 'sending', 'retrying')`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('mail_outbox').execute();
}
