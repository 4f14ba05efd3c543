import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
// Each stored shape records the schema version it was written with, so a later build can bring it to
// its own shape on read instead of rewriting history. Rows already stored get version 0: "written
// before versions were recorded". The default only fills those rows and is dropped at once, so every
// writer from now on has to say which version it wrote. Adding a column is DDL, not an UPDATE, so the
// append-only triggers do not fire and need no exception.
const TABLES = ['plan_revisions', 'checks', 'rule_sets', 'reports'] as const;

export async function up(db: Kysely<any>): Promise<void> {
  for (const table of TABLES) {
    await db.schema
      .alterTable(table)
      .addColumn('schema_version', 'integer', (c) => c.notNull().defaultTo(0).check(sql`schema_version >= 0`))
      .execute();
    await db.schema.alterTable(table).alterColumn('schema_version', (c) => c.dropDefault()).execute();
  }
  // history_guard() compares whole rows, so it already covers the new column. rule_sets_guard() lists
  // what retiring may not change; the parameters' version joins that list.
  await sql`
    CREATE OR REPLACE FUNCTION rule_sets_guard() RETURNS trigger LANGUAGE plpgsql AS $$
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
         AND NEW.parameters = OLD.parameters AND NEW.schema_version = OLD.schema_version
         AND NEW.changelog = OLD.changelog AND NEW.version = OLD.version
         AND NEW.jurisdiction_id = OLD.jurisdiction_id AND NEW.published_at = OLD.published_at
         AND NEW.based_on_id IS NOT DISTINCT FROM OLD.based_on_id AND NEW.revision = OLD.revision THEN
        RETURN NEW;
      END IF;
      RAISE EXCEPTION 'rule set version % is %: it cannot be changed', OLD.version, OLD.status USING ERRCODE = 'check_violation';
    END $$`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    CREATE OR REPLACE FUNCTION rule_sets_guard() RETURNS trigger LANGUAGE plpgsql AS $$
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
  // Dropping a column is DDL too: the append-only triggers do not fire.
  for (const table of TABLES) await db.schema.alterTable(table).dropColumn('schema_version').execute();
}
