import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
// Sign-in attempts are counted in rate_limits now, by e-mail together with the client address and by
// address alone; the e-mail-only lock table goes (it let anyone lock a person out from anywhere).
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('sign_in_throttle').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('sign_in_throttle')
    .addColumn('email', 'text', (c) => c.primaryKey())
    .addColumn('failures', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('window_started_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('locked_until', 'timestamptz')
    .execute();
}
