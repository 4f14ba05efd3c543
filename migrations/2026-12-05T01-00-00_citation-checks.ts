import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// An admin's statement that a rule's citation was checked against the adopted text. Kept apart from
// rule_sets and rules, and append-only, so an auditor can trust it: a mark is made only while its
// version is a draft (the insert trigger refuses marks on published or retired versions, so nobody can
// vouch for a version after the fact), checked_at is the database's own clock, and a mark is never
// edited or deleted: withdrawing it appends a row with checked = false. A new draft copied from a
// version carries its marks forward as new rows pointing at the original (carried_from_id), whose
// who and when stay those of the original check. There is no foreign key to rule_sets: a discarded
// draft's marks stay as history of what was checked.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('citation_checks')
    .addColumn('id', 'bigserial', (c) => c.primaryKey())
    .addColumn('jurisdiction_id', 'uuid', (c) => c.notNull().references('jurisdictions.id').onDelete('restrict'))
    .addColumn('rule_set_id', 'uuid', (c) => c.notNull())
    .addColumn('rule_key', 'text', (c) => c.notNull().check(sql`length(rule_key) BETWEEN 1 AND 120`))
    // The citation as it read when checked ("IRC 2021 M1502.4.6.1"): a later re-citation is unchecked.
    .addColumn('citation', 'text', (c) => c.notNull().check(sql`length(citation) BETWEEN 1 AND 300`))
    .addColumn('checked', 'boolean', (c) => c.notNull())
    .addColumn('checked_against', 'text', (c) => c.check(sql`checked_against IS NULL OR length(checked_against) BETWEEN 1 AND 300`))
    .addColumn('checked_by', 'uuid', (c) => c.references('users.id').onDelete('restrict'))
    .addColumn('checked_by_name', 'text', (c) => c.notNull())
    .addColumn('checked_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('carried_from_id', 'bigint', (c) => c.references('citation_checks.id').onDelete('restrict'))
    .addCheckConstraint('citation_checks_checked_says_against', sql`NOT checked OR checked_against IS NOT NULL`)
    .execute();
  await sql`CREATE INDEX citation_checks_rule_set ON citation_checks (rule_set_id, rule_key, id)`.execute(db);

  await sql`
    CREATE FUNCTION citation_checks_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      set_status text;
    BEGIN
      IF TG_OP <> 'INSERT' THEN
        RAISE EXCEPTION 'citation checks are append-only: record a new mark instead' USING ERRCODE = 'check_violation';
      END IF;
      SELECT status INTO set_status FROM rule_sets WHERE id = NEW.rule_set_id;
      IF set_status IS DISTINCT FROM 'draft' THEN
        RAISE EXCEPTION 'citations are marked on a draft; this version is %', coalesce(set_status, 'missing') USING ERRCODE = 'check_violation';
      END IF;
      NEW.checked_at := now();
      RETURN NEW;
    END $$`.execute(db);
  await sql`CREATE TRIGGER citation_checks_append_only BEFORE INSERT OR UPDATE OR DELETE ON citation_checks FOR EACH ROW EXECUTE FUNCTION citation_checks_guard()`.execute(db);
  await sql`CREATE TRIGGER citation_checks_no_truncate BEFORE TRUNCATE ON citation_checks FOR EACH STATEMENT EXECUTE FUNCTION refuse_change()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('citation_checks').execute();
  await sql`DROP FUNCTION IF EXISTS citation_checks_guard()`.execute(db);
}
