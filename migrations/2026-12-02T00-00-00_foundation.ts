import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('organizations')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('name', 'text', (c) => c.notNull().unique())
    .addColumn('license_number', 'text')
    .addColumn('is_demo', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('jurisdictions')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('slug', 'text', (c) => c.notNull().unique().check(sql`slug ~ '^[a-z0-9]+(-[a-z0-9]+)*$'`))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('region', 'text', (c) => c.notNull())
    .addColumn('building_edition', 'text', (c) => c.notNull())
    .addColumn('electrical_edition', 'text', (c) => c.notNull())
    .addColumn('plumbing_edition', 'text', (c) => c.notNull())
    .addColumn('plumbing_family', 'text', (c) => c.notNull().check(sql`plumbing_family IN ('IPC', 'UPC', 'IRC')`))
    .addColumn('mechanical_edition', 'text', (c) => c.notNull())
    .addColumn('fuel_gas_edition', 'text', (c) => c.notNull())
    .addColumn('inspector_email', 'text')
    .addColumn('amendment_notes', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('is_demo', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('users')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('email', 'text', (c) => c.notNull().check(sql`email = lower(email) AND position('@' in email) > 1`))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('password_hash', 'text', (c) => c.notNull())
    .addColumn('role', 'text', (c) => c.notNull().check(sql`role IN ('installer', 'inspector', 'admin')`))
    .addColumn('organization_id', 'uuid', (c) => c.references('organizations.id').onDelete('restrict'))
    .addColumn('jurisdiction_id', 'uuid', (c) => c.references('jurisdictions.id').onDelete('restrict'))
    .addColumn('is_demo', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    // An installer works for a company; an inspector for one jurisdiction.
    .addCheckConstraint('users_installer_has_organization', sql`role <> 'installer' OR organization_id IS NOT NULL`)
    .addCheckConstraint('users_inspector_has_jurisdiction', sql`role <> 'inspector' OR jurisdiction_id IS NOT NULL`)
    .execute();
  await db.schema.createIndex('users_email_unique').on('users').column('email').unique().execute();
  await db.schema.createIndex('users_organization_idx').on('users').column('organization_id').execute();

  await db.schema
    .createTable('api_tokens')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('token_hash', 'text', (c) => c.notNull())
    .addColumn('token_prefix', 'text', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('last_used_at', 'timestamptz')
    .addColumn('revoked_at', 'timestamptz')
    .execute();
  await db.schema.createIndex('api_tokens_hash_unique').on('api_tokens').column('token_hash').unique().execute();
  await db.schema.createIndex('api_tokens_user_idx').on('api_tokens').column('user_id').execute();

  await db.schema
    .createTable('sign_in_throttle')
    .addColumn('email', 'text', (c) => c.primaryKey())
    .addColumn('failures', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('window_started_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('locked_until', 'timestamptz')
    .execute();

  await db.schema
    .createTable('audit_log')
    .addColumn('id', 'bigserial', (c) => c.primaryKey())
    .addColumn('at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('actor_user_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('action', 'text', (c) => c.notNull())
    .addColumn('entity_type', 'text', (c) => c.notNull())
    .addColumn('entity_id', 'text')
    .addColumn('details', 'jsonb', (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .execute();
  await db.schema.createIndex('audit_log_entity_idx').on('audit_log').columns(['entity_type', 'entity_id']).execute();

  // The audit trail is append-only: the database refuses to rewrite history.
  await sql`
    CREATE FUNCTION refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION '% on % is not allowed: rows are append-only', TG_OP, TG_TABLE_NAME
        USING ERRCODE = 'check_violation';
    END $$`.execute(db);
  // An actor's deletion may null the actor column (ON DELETE SET NULL); nothing else may change.
  await sql`
    CREATE FUNCTION audit_log_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'UPDATE' AND NEW.actor_user_id IS NULL AND OLD.actor_user_id IS NOT NULL
         AND NEW.at = OLD.at AND NEW.action = OLD.action AND NEW.entity_type = OLD.entity_type
         AND NEW.entity_id IS NOT DISTINCT FROM OLD.entity_id AND NEW.details = OLD.details THEN
        RETURN NEW;
      END IF;
      RAISE EXCEPTION '% on audit_log is not allowed: the audit trail is append-only', TG_OP
        USING ERRCODE = 'check_violation';
    END $$`.execute(db);
  await sql`CREATE TRIGGER audit_log_append_only BEFORE UPDATE OR DELETE ON audit_log
            FOR EACH ROW EXECUTE FUNCTION audit_log_guard()`.execute(db);
  await sql`CREATE TRIGGER audit_log_no_truncate BEFORE TRUNCATE ON audit_log
            FOR EACH STATEMENT EXECUTE FUNCTION refuse_change()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('audit_log').execute();
  await sql`DROP FUNCTION IF EXISTS audit_log_guard()`.execute(db);
  await sql`DROP FUNCTION IF EXISTS refuse_change()`.execute(db);
  await db.schema.dropTable('sign_in_throttle').execute();
  await db.schema.dropTable('api_tokens').execute();
  await db.schema.dropTable('users').execute();
  await db.schema.dropTable('jurisdictions').execute();
  await db.schema.dropTable('organizations').execute();
}
