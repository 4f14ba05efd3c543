import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
// One row per signed-in browser, named by the session cookie (its `sid` claim): sign-out revokes the row,
// and a copied cookie is worth nothing once its row is revoked or past its absolute expiry.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('sessions')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('last_seen_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .addColumn('revoked_at', 'timestamptz')
    .addColumn('user_agent', 'text', (c) => c.check(sql`length(user_agent) <= 512`))
    .addColumn('client_address', 'text', (c) => c.check(sql`length(client_address) <= 255`))
    .addCheckConstraint('sessions_expire_after_creation', sql`expires_at >= created_at`)
    .execute();
  await db.schema.createIndex('sessions_user_idx').on('sessions').columns(['user_id', 'expires_at']).execute();

  // The lifetime is absolute: nothing moves an expiry later, un-revokes a session or hands it to someone else.
  await sql`
    CREATE FUNCTION sessions_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.id <> OLD.id OR NEW.user_id <> OLD.user_id OR NEW.created_at <> OLD.created_at THEN
        RAISE EXCEPTION 'a session keeps its id, user and creation time';
      END IF;
      IF NEW.expires_at > OLD.expires_at THEN
        RAISE EXCEPTION 'a session''s expiry can only move earlier';
      END IF;
      IF OLD.revoked_at IS NOT NULL AND NEW.revoked_at IS DISTINCT FROM OLD.revoked_at THEN
        RAISE EXCEPTION 'a revoked session stays revoked';
      END IF;
      RETURN NEW;
    END $$`.execute(db);
  await sql`CREATE TRIGGER sessions_absolute BEFORE UPDATE ON sessions FOR EACH ROW EXECUTE FUNCTION sessions_guard()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('sessions').execute();
  await sql`DROP FUNCTION IF EXISTS sessions_guard()`.execute(db);
}
