import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// Each report keeps what it said when issued (project name, site address, permit number, jurisdiction,
// company, rule set version, check date, summary counts, outcome) in `snapshot`, with its schema version.
//
// Reports issued before this migration are not backfilled. The only source would be today's project,
// company and jurisdiction rows, which are exactly what may have changed since the report was issued;
// writing them into `snapshot` would certify today's values as the issued ones. The append-only trigger
// also refuses UPDATE on reports, and lifting it here would be the one place history gets rewritten.
// Those rows keep snapshot NULL; readers fall back to the current rows and say so, and the stored PDF
// (whose SHA-256 is on record) remains what the report said.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('reports').addColumn('snapshot', 'jsonb').execute();
  await sql`COMMENT ON COLUMN reports.snapshot IS
    'What the report said when issued ({schemaVersion, project, jurisdiction, company, ruleSet, check}); NULL only for reports issued before 2026-12-04'`.execute(db);
  // Every report issued from now on carries one: enforced on INSERT only, so the older rows stay valid
  // (a CHECK constraint would also be re-tested when a deleted user's id is cleared from them).
  await sql`
    CREATE FUNCTION report_snapshot_required() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.snapshot IS NULL OR jsonb_typeof(NEW.snapshot) <> 'object' OR NOT (NEW.snapshot ? 'schemaVersion') THEN
        RAISE EXCEPTION 'a report must store the snapshot it was issued with' USING ERRCODE = 'not_null_violation';
      END IF;
      RETURN NEW;
    END $$`.execute(db);
  await sql`CREATE TRIGGER reports_snapshot_required BEFORE INSERT ON reports
            FOR EACH ROW EXECUTE FUNCTION report_snapshot_required()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP TRIGGER IF EXISTS reports_snapshot_required ON reports`.execute(db);
  await sql`DROP FUNCTION IF EXISTS report_snapshot_required()`.execute(db);
  await db.schema.alterTable('reports').dropColumn('snapshot').execute();
}
