import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('projects')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organization_id', 'uuid', (c) => c.notNull().references('organizations.id').onDelete('restrict'))
    .addColumn('jurisdiction_id', 'uuid', (c) => c.notNull().references('jurisdictions.id').onDelete('restrict'))
    .addColumn('name', 'text', (c) => c.notNull().check(sql`length(trim(name)) > 0`))
    .addColumn('site_address', 'text', (c) => c.notNull())
    .addColumn('permit_number', 'text')
    .addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('is_demo', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('archived_at', 'timestamptz')
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('projects_org_idx').on('projects').columns(['organization_id', 'archived_at']).execute();
  await db.schema.createIndex('projects_jurisdiction_idx').on('projects').column('jurisdiction_id').execute();

  await db.schema
    .createTable('plan_revisions')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('project_id', 'uuid', (c) => c.notNull().references('projects.id').onDelete('restrict'))
    .addColumn('number', 'integer', (c) => c.notNull().check(sql`number > 0`))
    // The plan as the installer entered it (mixed units kept), and its canonical form.
    .addColumn('plan', 'jsonb', (c) => c.notNull())
    .addColumn('canonical', 'jsonb', (c) => c.notNull())
    .addColumn('change_summary', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('plan_revisions_project_number_unique', ['project_id', 'number'])
    .execute();

  await db.schema
    .createTable('checks')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('project_id', 'uuid', (c) => c.notNull().references('projects.id').onDelete('restrict'))
    .addColumn('plan_revision_id', 'uuid', (c) => c.notNull().references('plan_revisions.id').onDelete('restrict'))
    .addColumn('rule_set_id', 'uuid', (c) => c.notNull().references('rule_sets.id').onDelete('restrict'))
    .addColumn('inputs', 'jsonb', (c) => c.notNull())
    .addColumn('facts', 'jsonb', (c) => c.notNull())
    .addColumn('findings', 'jsonb', (c) => c.notNull())
    .addColumn('summary', 'jsonb', (c) => c.notNull())
    .addColumn('outcome', 'text', (c) => c.notNull().check(sql`outcome IN ('pass', 'fail', 'incomplete')`))
    .addColumn('duration_ms', 'integer', (c) => c.notNull())
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('checks_project_idx').on('checks').columns(['project_id', 'created_at']).execute();

  // Plan revisions and checks are history: append-only, enforced here and not only in the app.
  // (A creator's account removal may null created_by; nothing else changes.)
  await sql`
    CREATE FUNCTION history_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'UPDATE' AND NEW.created_by IS NULL AND OLD.created_by IS NOT NULL
         AND (to_jsonb(NEW) - 'created_by') = (to_jsonb(OLD) - 'created_by') THEN
        RETURN NEW;
      END IF;
      RAISE EXCEPTION '% on % is not allowed: rows are append-only', TG_OP, TG_TABLE_NAME USING ERRCODE = 'check_violation';
    END $$`.execute(db);
  for (const table of ['plan_revisions', 'checks']) {
    await sql`CREATE TRIGGER ${sql.raw(table + '_append_only')} BEFORE UPDATE OR DELETE ON ${sql.table(table)}
              FOR EACH ROW EXECUTE FUNCTION history_guard()`.execute(db);
    await sql`CREATE TRIGGER ${sql.raw(table + '_no_truncate')} BEFORE TRUNCATE ON ${sql.table(table)}
              FOR EACH STATEMENT EXECUTE FUNCTION refuse_change()`.execute(db);
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('checks').execute();
  await db.schema.dropTable('plan_revisions').execute();
  await db.schema.dropTable('projects').execute();
  await sql`DROP FUNCTION IF EXISTS history_guard()`.execute(db);
}
