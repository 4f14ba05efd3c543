import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// A photo's thumbnail, report-size image and copy without metadata are made by a job after the upload has
// answered. `derivatives_status` moves pending → making → ready, or → retrying (attempts so far) → failed after
// the last attempt; "make again" puts a failed row back to pending. A worker claims a row by a conditional UPDATE
// (pending/retrying → making), so two app servers or a duplicated job make and store the images once.
// Rows from before the job existed had their images made inside the upload: they are ready. Documents get no
// images and are ready at once.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('attachments')
    .addColumn('derivatives_status', 'text', (c) =>
      c.notNull().defaultTo('ready').check(sql`derivatives_status IN ('pending', 'making', 'retrying', 'ready', 'failed')`),
    )
    .addColumn('derivatives_attempts', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('derivatives_max_attempts', 'integer', (c) => c.notNull().defaultTo(1).check(sql`derivatives_max_attempts BETWEEN 1 AND 20`))
    .addColumn('derivatives_error', 'text')
    .addColumn('derivatives_claimed_at', 'timestamptz')
    .addColumn('derivatives_updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  // New rows must say what they are; a row written without a state is waiting, never silently "ready".
  await sql`ALTER TABLE attachments ALTER COLUMN derivatives_status SET DEFAULT 'pending'`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('attachments')
    .dropColumn('derivatives_status')
    .dropColumn('derivatives_attempts')
    .dropColumn('derivatives_max_attempts')
    .dropColumn('derivatives_error')
    .dropColumn('derivatives_claimed_at')
    .dropColumn('derivatives_updated_at')
    .execute();
}
