import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// Impact runs (a published version over every open project's latest check) and dry runs (a draft over the demo
// plans and every open project's latest plan) run as jobs. Each request is a row: queued → running → done with
// its result, or failed. A worker claims the row by a conditional UPDATE with a claim token of its own and writes
// progress and the result only while it holds that claim, so a retried or duplicated job neither counts twice nor
// writes a second result. A finished run is history: the database refuses to change it (only the links to a
// discarded draft or a removed person may be cleared) and refuses to delete any run.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('rule_set_runs')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('kind', 'text', (c) => c.notNull().check(sql`kind IN ('impact', 'dry-run')`))
    .addColumn('jurisdiction_id', 'uuid', (c) => c.notNull().references('jurisdictions.id').onDelete('restrict'))
    // The published version (impact) or the draft (dry run); a discarded draft leaves its runs with no link.
    .addColumn('rule_set_id', 'uuid', (c) => c.references('rule_sets.id').onDelete('set null'))
    .addColumn('rule_set_version', 'integer', (c) => c.notNull())
    // The draft's revision when the run was asked for; the result names the revision it evaluated.
    .addColumn('draft_revision', 'integer')
    .addColumn('state', 'text', (c) => c.notNull().defaultTo('queued').check(sql`state IN ('queued', 'running', 'done', 'failed')`))
    .addColumn('done_count', 'integer', (c) => c.notNull().defaultTo(0).check(sql`done_count >= 0`))
    .addColumn('total_count', 'integer', (c) => c.check(sql`total_count >= 0`))
    .addColumn('result', 'jsonb')
    .addColumn('error', 'text')
    .addColumn('attempts', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('claim_token', 'uuid')
    .addColumn('claimed_at', 'timestamptz')
    .addColumn('requested_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('started_at', 'timestamptz')
    .addColumn('finished_at', 'timestamptz')
    .addCheckConstraint('rule_set_runs_dry_run_has_revision', sql`kind <> 'dry-run' OR draft_revision IS NOT NULL`)
    .addCheckConstraint('rule_set_runs_done_has_result', sql`state <> 'done' OR (result IS NOT NULL AND total_count IS NOT NULL AND done_count = total_count)`)
    .addCheckConstraint('rule_set_runs_done_within_total', sql`total_count IS NULL OR done_count <= total_count`)
    .execute();
  await sql`CREATE INDEX rule_set_runs_latest ON rule_set_runs (kind, rule_set_id, created_at DESC)`.execute(db);
  await sql`CREATE INDEX rule_set_runs_jurisdiction ON rule_set_runs (jurisdiction_id, created_at DESC)`.execute(db);
  await sql`
    CREATE FUNCTION rule_set_runs_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        RAISE EXCEPTION 'rule set runs are kept: a new run is a new row' USING ERRCODE = 'check_violation';
      END IF;
      IF OLD.state IN ('done', 'failed')
         AND NOT ((to_jsonb(NEW) - 'rule_set_id' - 'requested_by') = (to_jsonb(OLD) - 'rule_set_id' - 'requested_by')
                  AND (NEW.rule_set_id IS NOT DISTINCT FROM OLD.rule_set_id OR NEW.rule_set_id IS NULL)
                  AND (NEW.requested_by IS NOT DISTINCT FROM OLD.requested_by OR NEW.requested_by IS NULL)) THEN
        RAISE EXCEPTION 'a finished rule set run cannot change' USING ERRCODE = 'check_violation';
      END IF;
      RETURN NEW;
    END $$`.execute(db);
  await sql`CREATE TRIGGER rule_set_runs_history BEFORE UPDATE OR DELETE ON rule_set_runs FOR EACH ROW EXECUTE FUNCTION rule_set_runs_guard()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('rule_set_runs').execute();
  await sql`DROP FUNCTION IF EXISTS rule_set_runs_guard()`.execute(db);
}
