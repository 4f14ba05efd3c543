import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// The conversation on one sent report, all append-only:
// - report_sends.note keeps the installer's note sent with the report (NULL for sends recorded before).
// - inspection_reviews.revises_id: a revised outcome is a new row pointing at the one it replaces; a row
//   is revised at most once, so the outcomes of a report form one line.
// - correction_answers: the installer's answer to a "corrections needed" outcome, a newer check of the
//   project (with the report issued for it) and a note; one answer per outcome.
// - inspection_reviews.answer_id: the answer an outcome was recorded on (NULL for the first outcome).
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('report_sends').addColumn('note', 'text').execute();

  await sql`ALTER TABLE inspection_reviews ADD CONSTRAINT inspection_reviews_report_id_id_key UNIQUE (report_id, id)`.execute(db);
  await db.schema.alterTable('inspection_reviews').addColumn('revises_id', 'uuid').execute();
  await sql`ALTER TABLE inspection_reviews ADD CONSTRAINT inspection_reviews_revises_fk
            FOREIGN KEY (report_id, revises_id) REFERENCES inspection_reviews (report_id, id) ON DELETE RESTRICT`.execute(db);
  await sql`CREATE UNIQUE INDEX inspection_reviews_revised_once ON inspection_reviews (revises_id) WHERE revises_id IS NOT NULL`.execute(db);

  await db.schema
    .createTable('correction_answers')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('report_id', 'uuid', (c) => c.notNull().references('reports.id').onDelete('restrict'))
    .addColumn('review_id', 'uuid', (c) => c.notNull())
    .addColumn('check_id', 'uuid', (c) => c.notNull().references('checks.id').onDelete('restrict'))
    .addColumn('answer_report_id', 'uuid', (c) => c.notNull().references('reports.id').onDelete('restrict'))
    .addColumn('note', 'text', (c) => c.notNull())
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('correction_answers_review_once', ['review_id'])
    .addUniqueConstraint('correction_answers_report_id_id_key', ['report_id', 'id'])
    .addForeignKeyConstraint('correction_answers_review_fk', ['report_id', 'review_id'], 'inspection_reviews', ['report_id', 'id'], (c) => c.onDelete('restrict'))
    .addCheckConstraint('correction_answers_note_length', sql`char_length(note) BETWEEN 1 AND 4000`)
    .execute();
  await db.schema.createIndex('correction_answers_report_idx').on('correction_answers').column('report_id').execute();
  await db.schema.createIndex('correction_answers_answer_report_idx').on('correction_answers').column('answer_report_id').execute();
  await sql`CREATE TRIGGER correction_answers_append_only BEFORE UPDATE OR DELETE ON correction_answers
            FOR EACH ROW EXECUTE FUNCTION history_guard()`.execute(db);

  await db.schema.alterTable('inspection_reviews').addColumn('answer_id', 'uuid').execute();
  await sql`ALTER TABLE inspection_reviews ADD CONSTRAINT inspection_reviews_answer_fk
            FOREIGN KEY (report_id, answer_id) REFERENCES correction_answers (report_id, id) ON DELETE RESTRICT`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE inspection_reviews DROP CONSTRAINT IF EXISTS inspection_reviews_answer_fk`.execute(db);
  await db.schema.alterTable('inspection_reviews').dropColumn('answer_id').execute();
  await db.schema.dropTable('correction_answers').execute();
  await sql`DROP INDEX IF EXISTS inspection_reviews_revised_once`.execute(db);
  await sql`ALTER TABLE inspection_reviews DROP CONSTRAINT IF EXISTS inspection_reviews_revises_fk`.execute(db);
  await db.schema.alterTable('inspection_reviews').dropColumn('revises_id').execute();
  await sql`ALTER TABLE inspection_reviews DROP CONSTRAINT IF EXISTS inspection_reviews_report_id_id_key`.execute(db);
  await db.schema.alterTable('report_sends').dropColumn('note').execute();
}
