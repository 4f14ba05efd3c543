import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('rule_sets')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('jurisdiction_id', 'uuid', (c) => c.notNull().references('jurisdictions.id').onDelete('restrict'))
    .addColumn('version', 'integer', (c) => c.notNull().check(sql`version > 0`))
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('draft').check(sql`status IN ('draft', 'published', 'retired')`))
    .addColumn('parameters', 'jsonb', (c) => c.notNull())
    .addColumn('changelog', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('based_on_id', 'uuid', (c) => c.references('rule_sets.id').onDelete('restrict'))
    // Bumped on every draft save, for optimistic concurrency between admins.
    .addColumn('revision', 'integer', (c) => c.notNull().defaultTo(1))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('published_at', 'timestamptz')
    .addColumn('published_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('retired_at', 'timestamptz')
    .addUniqueConstraint('rule_sets_jurisdiction_version_unique', ['jurisdiction_id', 'version'])
    .addCheckConstraint('rule_sets_published_has_date', sql`status = 'draft' OR published_at IS NOT NULL`)
    .addCheckConstraint('rule_sets_published_has_changelog', sql`status = 'draft' OR length(trim(changelog)) > 0`)
    .execute();
  // At most one published version per jurisdiction.
  await sql`CREATE UNIQUE INDEX rule_sets_one_published ON rule_sets (jurisdiction_id) WHERE status = 'published'`.execute(db);

  await db.schema
    .createTable('rules')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('rule_set_id', 'uuid', (c) => c.notNull().references('rule_sets.id').onDelete('cascade'))
    .addColumn('key', 'text', (c) => c.notNull().check(sql`key ~ '^[a-z0-9-]+(\\.[a-z0-9-]+)+$'`))
    .addColumn('position', 'integer', (c) => c.notNull())
    .addColumn('title', 'text', (c) => c.notNull())
    .addColumn('area', 'text', (c) => c.notNull())
    .addColumn('enabled', 'boolean', (c) => c.notNull().defaultTo(true))
    .addColumn('conditions', 'jsonb', (c) => c.notNull())
    // The rest of the rule: citation, confidence, severity, required facts, messages, remedy key.
    .addColumn('definition', 'jsonb', (c) => c.notNull())
    .addUniqueConstraint('rules_rule_set_key_unique', ['rule_set_id', 'key'])
    .execute();

  // A published or retired version is history: its parameters and rules never change again.
  await sql`
    CREATE FUNCTION rule_sets_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        IF OLD.status <> 'draft' THEN
          RAISE EXCEPTION 'rule set version % is %: it cannot be deleted', OLD.version, OLD.status USING ERRCODE = 'check_violation';
        END IF;
        RETURN OLD;
      END IF;
      IF OLD.status = 'draft' THEN
        IF NEW.status = 'retired' THEN
          RAISE EXCEPTION 'a draft cannot be retired; delete it instead' USING ERRCODE = 'check_violation';
        END IF;
        RETURN NEW;
      END IF;
      IF OLD.status = 'published' AND NEW.status = 'retired'
         AND NEW.parameters = OLD.parameters AND NEW.changelog = OLD.changelog AND NEW.version = OLD.version
         AND NEW.jurisdiction_id = OLD.jurisdiction_id AND NEW.published_at = OLD.published_at
         AND NEW.based_on_id IS NOT DISTINCT FROM OLD.based_on_id AND NEW.revision = OLD.revision THEN
        RETURN NEW;
      END IF;
      RAISE EXCEPTION 'rule set version % is %: it cannot be changed', OLD.version, OLD.status USING ERRCODE = 'check_violation';
    END $$`.execute(db);
  await sql`CREATE TRIGGER rule_sets_immutable BEFORE UPDATE OR DELETE ON rule_sets FOR EACH ROW EXECUTE FUNCTION rule_sets_guard()`.execute(db);

  await sql`
    CREATE FUNCTION rules_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      set_status text;
    BEGIN
      SELECT status INTO set_status FROM rule_sets
        WHERE id = CASE WHEN TG_OP = 'DELETE' THEN OLD.rule_set_id ELSE NEW.rule_set_id END;
      IF set_status IS NULL THEN
        -- The parent draft is being deleted (cascade): allow its rules to go with it.
        RETURN CASE WHEN TG_OP = 'DELETE' THEN OLD ELSE NEW END;
      END IF;
      IF set_status <> 'draft' THEN
        RAISE EXCEPTION 'rules of a % rule set cannot be changed', set_status USING ERRCODE = 'check_violation';
      END IF;
      IF TG_OP = 'UPDATE' AND NEW.rule_set_id <> OLD.rule_set_id THEN
        RAISE EXCEPTION 'a rule cannot move to another rule set' USING ERRCODE = 'check_violation';
      END IF;
      RETURN CASE WHEN TG_OP = 'DELETE' THEN OLD ELSE NEW END;
    END $$`.execute(db);
  await sql`CREATE TRIGGER rules_immutable BEFORE INSERT OR UPDATE OR DELETE ON rules FOR EACH ROW EXECUTE FUNCTION rules_guard()`.execute(db);
  await sql`CREATE TRIGGER rules_no_truncate BEFORE TRUNCATE ON rules FOR EACH STATEMENT EXECUTE FUNCTION refuse_change()`.execute(db);
  await sql`CREATE TRIGGER rule_sets_no_truncate BEFORE TRUNCATE ON rule_sets FOR EACH STATEMENT EXECUTE FUNCTION refuse_change()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('rules').execute();
  await db.schema.dropTable('rule_sets').execute();
  await sql`DROP FUNCTION IF EXISTS rules_guard()`.execute(db);
  await sql`DROP FUNCTION IF EXISTS rule_sets_guard()`.execute(db);
}
