import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// A company's webhook endpoints and every delivery made to them.
// - webhook_endpoints.secret is kept as written: each delivery is signed with it (HMAC-SHA256), so it cannot
//   be hashed. Rotating replaces it; an endpoint with deliveries is deactivated, never deleted.
// - webhook_deliveries: one row per event and endpoint (the event id repeats across a company's endpoints,
//   never within one). What was sent (endpoint, event, payload, when) never changes; only the delivery's
//   own state columns move: queued → sending → delivered, or → retrying → failed after the last attempt,
//   and "send again" puts a failed row back to queued. A worker claims a row by a conditional UPDATE, so two
//   app servers or a retried job never deliver one row twice at once.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('webhook_endpoints')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organization_id', 'uuid', (c) => c.notNull().references('organizations.id').onDelete('restrict'))
    .addColumn('url', 'text', (c) => c.notNull().check(sql`char_length(url) BETWEEN 8 AND 2000`))
    .addColumn('events', sql`text[]`, (c) =>
      c.notNull().check(sql`cardinality(events) >= 1 AND events <@ ARRAY['report.sent', 'inspection.outcome_recorded']::text[]`),
    )
    .addColumn('secret', 'text', (c) => c.notNull().check(sql`char_length(secret) BETWEEN 32 AND 200`))
    .addColumn('is_active', 'boolean', (c) => c.notNull().defaultTo(true))
    .addColumn('secret_rotated_at', 'timestamptz')
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('webhook_endpoints_organization_idx').on('webhook_endpoints').columns(['organization_id', 'created_at']).execute();

  await db.schema
    .createTable('webhook_deliveries')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('endpoint_id', 'uuid', (c) => c.notNull().references('webhook_endpoints.id').onDelete('restrict'))
    .addColumn('event_id', 'uuid', (c) => c.notNull())
    .addColumn('event_type', 'text', (c) => c.notNull().check(sql`event_type IN ('report.sent', 'inspection.outcome_recorded')`))
    .addColumn('payload', 'jsonb', (c) => c.notNull())
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('queued').check(sql`status IN ('queued', 'sending', 'retrying', 'delivered', 'failed')`))
    .addColumn('attempts', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('max_attempts', 'integer', (c) => c.notNull().check(sql`max_attempts BETWEEN 1 AND 20`))
    .addColumn('last_response_status', 'integer')
    .addColumn('last_error', 'text', (c) => c.check(sql`char_length(last_error) <= 500`))
    .addColumn('next_attempt_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('claimed_at', 'timestamptz')
    .addColumn('delivered_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('webhook_deliveries_event_once', ['endpoint_id', 'event_id'])
    .execute();
  await db.schema.createIndex('webhook_deliveries_endpoint_idx').on('webhook_deliveries').columns(['endpoint_id', 'created_at']).execute();
  // The periodic pass looks only at deliveries still under way.
  await sql`CREATE INDEX webhook_deliveries_pending_idx ON webhook_deliveries (next_attempt_at) WHERE status IN ('queued', 'sending', 'retrying')`.execute(db);

  // What was sent stays as sent: only the state columns may change, and no delivery is removed.
  await sql`
    CREATE FUNCTION webhook_deliveries_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        RAISE EXCEPTION 'webhook deliveries are history and are never deleted' USING ERRCODE = 'restrict_violation';
      END IF;
      IF NEW.endpoint_id IS DISTINCT FROM OLD.endpoint_id OR NEW.event_id IS DISTINCT FROM OLD.event_id
         OR NEW.event_type IS DISTINCT FROM OLD.event_type OR NEW.payload IS DISTINCT FROM OLD.payload
         OR NEW.created_at IS DISTINCT FROM OLD.created_at OR NEW.id IS DISTINCT FROM OLD.id THEN
        RAISE EXCEPTION 'a webhook delivery keeps what was sent; only its state may change' USING ERRCODE = 'restrict_violation';
      END IF;
      RETURN NEW;
    END $$`.execute(db);
  await sql`CREATE TRIGGER webhook_deliveries_history BEFORE UPDATE OR DELETE ON webhook_deliveries
            FOR EACH ROW EXECUTE FUNCTION webhook_deliveries_guard()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('webhook_deliveries').execute();
  await sql`DROP FUNCTION IF EXISTS webhook_deliveries_guard()`.execute(db);
  await db.schema.dropTable('webhook_endpoints').execute();
}
