import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
// The shape the rate limiter library expects for its PostgreSQL store (key, points, expire in epoch ms);
// one table shared by every app server, so a limit counts across all of them.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('rate_limits')
    .addColumn('key', 'varchar(255)', (c) => c.primaryKey())
    .addColumn('points', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('expire', 'bigint')
    .execute();
  await db.schema.createIndex('rate_limits_expire_idx').on('rate_limits').column('expire').execute();
  await sql`COMMENT ON TABLE rate_limits IS 'Request counters of the shared rate limiter; rows expire on their own.'`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('rate_limits').execute();
}
