import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// A report enters a jurisdiction's inspector queue (and its inspectors may open it and its photos) only
// when it was sent to that jurisdiction's inspector address; `to_inspector` records whether it was, as
// decided at the time of sending. Sends recorded before have NULL: which address was the inspector's then
// is not known, and report_sends is append-only. Readers decide those by today's inspector address.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('report_sends').addColumn('to_inspector', 'boolean').execute();
  await sql`COMMENT ON COLUMN report_sends.to_inspector IS
    'Sent to the jurisdiction''s inspector address when sent; NULL only for sends recorded before 2026-12-04'`.execute(db);
  await sql`
    CREATE FUNCTION report_send_recipient_known() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.to_inspector IS NULL THEN
        RAISE EXCEPTION 'a report send must record whether it went to the inspector' USING ERRCODE = 'not_null_violation';
      END IF;
      RETURN NEW;
    END $$`.execute(db);
  await sql`CREATE TRIGGER report_sends_recipient_known BEFORE INSERT ON report_sends
            FOR EACH ROW EXECUTE FUNCTION report_send_recipient_known()`.execute(db);
  // The company's earlier recipients are looked up on every send.
  await sql`CREATE INDEX report_sends_project_to_idx ON report_sends (project_id, lower(to_email)) WHERE status = 'sent'`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP INDEX IF EXISTS report_sends_project_to_idx`.execute(db);
  await sql`DROP TRIGGER IF EXISTS report_sends_recipient_known ON report_sends`.execute(db);
  await sql`DROP FUNCTION IF EXISTS report_send_recipient_known()`.execute(db);
  await db.schema.alterTable('report_sends').dropColumn('to_inspector').execute();
}
