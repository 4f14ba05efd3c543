import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// People and companies that serve themselves: a company's owners, people switched off when they leave,
// confirmed e-mail addresses, invitations, password resets and e-mail confirmations (each a single-use token
// stored only as its SHA-256), company details printed on reports, and audit rows a company's owners may read.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('users')
    .addColumn('is_owner', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('deactivated_at', 'timestamptz')
    .addColumn('email_confirmed_at', 'timestamptz')
    .addColumn('password_changed_at', 'timestamptz')
    .execute();
  // Only an installer belongs to a company, so only an installer can own one.
  await sql`ALTER TABLE users ADD CONSTRAINT users_owner_is_installer CHECK (NOT is_owner OR role = 'installer')`.execute(db);
  // Accounts made before sign-up existed were made by an administrator, who vouched for the address.
  await sql`UPDATE users SET email_confirmed_at = created_at WHERE email_confirmed_at IS NULL`.execute(db);

  await db.schema
    .alterTable('organizations')
    .addColumn('address', 'text', (c) => c.notNull().defaultTo('').check(sql`length(address) <= 300`))
    .addColumn('phone', 'text', (c) => c.notNull().defaultTo('').check(sql`length(phone) <= 40`))
    .addColumn('default_jurisdiction_id', 'uuid', (c) => c.references('jurisdictions.id').onDelete('set null'))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('invitations')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('email', 'text', (c) => c.notNull().check(sql`email = lower(email) AND position('@' in email) > 1`))
    .addColumn('role', 'text', (c) => c.notNull().check(sql`role IN ('installer', 'owner', 'inspector', 'admin')`))
    .addColumn('organization_id', 'uuid', (c) => c.references('organizations.id').onDelete('cascade'))
    .addColumn('jurisdiction_id', 'uuid', (c) => c.references('jurisdictions.id').onDelete('restrict'))
    .addColumn('invited_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('token_hash', 'text', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .addColumn('accepted_at', 'timestamptz')
    .addColumn('accepted_user_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('revoked_at', 'timestamptz')
    .addCheckConstraint('invitations_company_roles_have_company',
      sql`role NOT IN ('installer', 'owner') OR organization_id IS NOT NULL`)
    .addCheckConstraint('invitations_inspector_has_jurisdiction', sql`role <> 'inspector' OR jurisdiction_id IS NOT NULL`)
    .addCheckConstraint('invitations_used_or_revoked_once', sql`accepted_at IS NULL OR revoked_at IS NULL`)
    .execute();
  await db.schema.createIndex('invitations_token_unique').on('invitations').column('token_hash').unique().execute();
  await db.schema.createIndex('invitations_organization_idx').on('invitations').columns(['organization_id', 'created_at']).execute();
  await sql`CREATE INDEX invitations_pending_email_idx ON invitations (email) WHERE accepted_at IS NULL AND revoked_at IS NULL`.execute(db);

  for (const table of ['password_resets', 'email_confirmations']) {
    await db.schema
      .createTable(table)
      .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
      .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
      .addColumn('token_hash', 'text', (c) => c.notNull())
      .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
      .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
      .addColumn('used_at', 'timestamptz')
      .execute();
    await db.schema.createIndex(`${table}_token_unique`).on(table).column('token_hash').unique().execute();
    await db.schema.createIndex(`${table}_user_idx`).on(table).column('user_id').execute();
  }

  // Owners read their own company's account events; admins read all.
  await db.schema.alterTable('audit_log').addColumn('organization_id', 'uuid').execute();
  await db.schema.createIndex('audit_log_organization_idx').on('audit_log').columns(['organization_id', 'at']).execute();
  await db.schema.createIndex('audit_log_at_idx').on('audit_log').columns(['at']).execute();
  await db.schema.createIndex('audit_log_action_idx').on('audit_log').columns(['action', 'at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP INDEX IF EXISTS audit_log_action_idx`.execute(db);
  await sql`DROP INDEX IF EXISTS audit_log_at_idx`.execute(db);
  await sql`DROP INDEX IF EXISTS audit_log_organization_idx`.execute(db);
  await db.schema.alterTable('audit_log').dropColumn('organization_id').execute();
  await db.schema.dropTable('email_confirmations').execute();
  await db.schema.dropTable('password_resets').execute();
  await db.schema.dropTable('invitations').execute();
  await db.schema
    .alterTable('organizations')
    .dropColumn('address')
    .dropColumn('phone')
    .dropColumn('default_jurisdiction_id')
    .dropColumn('updated_at')
    .execute();
  await sql`ALTER TABLE users DROP CONSTRAINT IF EXISTS users_owner_is_installer`.execute(db);
  await db.schema
    .alterTable('users')
    .dropColumn('is_owner')
    .dropColumn('deactivated_at')
    .dropColumn('email_confirmed_at')
    .dropColumn('password_changed_at')
    .execute();
}
