import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports app code.
//
// A pass every minute looks for work that should be in progress but shows no sign of it (a photo's images, an
// impact or dry run). Only unfinished rows are indexed, so the pass reads a handful of rows however many photos
// and runs are stored.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`CREATE INDEX attachments_derivatives_unfinished_idx ON attachments (derivatives_updated_at) WHERE derivatives_status IN ('pending', 'making', 'retrying')`.execute(db);
  await sql`CREATE INDEX rule_set_runs_unfinished_idx ON rule_set_runs (created_at) WHERE state IN ('queued', 'running')`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP INDEX IF EXISTS rule_set_runs_unfinished_idx`.execute(db);
  await sql`DROP INDEX IF EXISTS attachments_derivatives_unfinished_idx`.execute(db);
}
