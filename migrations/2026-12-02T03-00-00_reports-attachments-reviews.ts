import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('attachments')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('project_id', 'uuid', (c) => c.notNull().references('projects.id').onDelete('restrict'))
    .addColumn('kind', 'text', (c) => c.notNull().check(sql`kind IN ('photo', 'document')`))
    .addColumn('filename', 'text', (c) => c.notNull())
    .addColumn('content_type', 'text', (c) => c.notNull())
    .addColumn('byte_size', 'integer', (c) => c.notNull().check(sql`byte_size > 0`))
    .addColumn('sha256', 'text', (c) => c.notNull())
    .addColumn('storage_key', 'text', (c) => c.notNull().unique())
    .addColumn('thumbnail_key', 'text')
    .addColumn('width', 'integer')
    .addColumn('height', 'integer')
    .addColumn('caption', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('deleted_at', 'timestamptz')
    .execute();
  await db.schema.createIndex('attachments_project_idx').on('attachments').columns(['project_id', 'deleted_at']).execute();

  await db.schema
    .createTable('reports')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('check_id', 'uuid', (c) => c.notNull().references('checks.id').onDelete('restrict'))
    .addColumn('code', 'text', (c) => c.notNull().unique())
    .addColumn('sha256', 'text', (c) => c.notNull().check(sql`sha256 ~ '^[0-9a-f]{64}$'`))
    .addColumn('byte_size', 'integer', (c) => c.notNull())
    .addColumn('page_count', 'integer', (c) => c.notNull())
    .addColumn('storage_key', 'text', (c) => c.notNull())
    .addColumn('attachment_ids', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('reports_check_idx').on('reports').column('check_id').execute();

  await db.schema
    .createTable('report_sends')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('report_id', 'uuid', (c) => c.notNull().references('reports.id').onDelete('restrict'))
    .addColumn('project_id', 'uuid', (c) => c.notNull().references('projects.id').onDelete('restrict'))
    .addColumn('jurisdiction_id', 'uuid', (c) => c.notNull().references('jurisdictions.id').onDelete('restrict'))
    .addColumn('to_email', 'text', (c) => c.notNull())
    .addColumn('status', 'text', (c) => c.notNull().check(sql`status IN ('sent', 'failed')`))
    .addColumn('error', 'text')
    .addColumn('message_id', 'text')
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('report_sends_jurisdiction_idx').on('report_sends').columns(['jurisdiction_id', 'status']).execute();

  await db.schema
    .createTable('inspection_reviews')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('report_id', 'uuid', (c) => c.notNull().references('reports.id').onDelete('restrict'))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null')) // the inspector
    .addColumn('outcome', 'text', (c) => c.notNull().check(sql`outcome IN ('approved', 'corrections-needed')`))
    .addColumn('comment', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('finding_comments', 'jsonb', (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('inspection_reviews_report_idx').on('inspection_reviews').column('report_id').execute();

  // Issued reports, sends and inspectors' outcomes are records: append-only like checks.
  for (const table of ['reports', 'report_sends', 'inspection_reviews']) {
    await sql`CREATE TRIGGER ${sql.raw(table + '_append_only')} BEFORE UPDATE OR DELETE ON ${sql.table(table)}
              FOR EACH ROW EXECUTE FUNCTION history_guard()`.execute(db);
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('inspection_reviews').execute();
  await db.schema.dropTable('report_sends').execute();
  await db.schema.dropTable('reports').execute();
  await db.schema.dropTable('attachments').execute();
}
