import { sql, type Kysely } from 'kysely';

// Indexes behind the list pages at thousands of projects: each sort of the projects list reads its first page
// from an index (a company's own, or everyone's for administrators), the search's ILIKE '%…%' uses trigram
// indexes, and the administrators' people list
// reads in its order and searches names and e-mails by trigram. pg_trgm ships with
// PostgreSQL's contrib modules and is a trusted extension: a database owner may create it.

const projectOrders = ['updated_at', 'name', 'created_at'] as const;
const projectTexts = ['name', 'site_address', 'permit_number'] as const;
const userTexts = ['name', 'email'] as const;

export async function up(db: Kysely<any>): Promise<void> {
  await sql`CREATE EXTENSION IF NOT EXISTS pg_trgm`.execute(db);
  for (const column of projectOrders) {
    await sql`CREATE INDEX ${sql.raw(`projects_org_${column}_idx`)} ON projects (organization_id, ${sql.ref(column)}, id)`.execute(db);
    await sql`CREATE INDEX ${sql.raw(`projects_${column}_idx`)} ON projects (${sql.ref(column)}, id)`.execute(db);
  }
  for (const column of projectTexts) {
    await sql`CREATE INDEX ${sql.raw(`projects_${column}_trgm`)} ON projects USING gin (${sql.ref(column)} gin_trgm_ops)`.execute(db);
  }
  await sql`CREATE INDEX users_role_email_idx ON users (role, email)`.execute(db);
  await sql`CREATE INDEX users_jurisdiction_idx ON users (jurisdiction_id)`.execute(db);
  for (const column of userTexts) {
    await sql`CREATE INDEX ${sql.raw(`users_${column}_trgm`)} ON users USING gin (${sql.ref(column)} gin_trgm_ops)`.execute(db);
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const column of userTexts) await sql`DROP INDEX IF EXISTS ${sql.raw(`users_${column}_trgm`)}`.execute(db);
  await sql`DROP INDEX IF EXISTS users_jurisdiction_idx`.execute(db);
  await sql`DROP INDEX IF EXISTS users_role_email_idx`.execute(db);
  for (const column of projectTexts) await sql`DROP INDEX IF EXISTS ${sql.raw(`projects_${column}_trgm`)}`.execute(db);
  for (const column of projectOrders) {
    await sql`DROP INDEX IF EXISTS ${sql.raw(`projects_${column}_idx`)}`.execute(db);
    await sql`DROP INDEX IF EXISTS ${sql.raw(`projects_org_${column}_idx`)}`.execute(db);
  }
  // pg_trgm stays: other objects may have come to depend on it.
}
