import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
// Every API token ends. Tokens made before expiry existed get 90 days from this migration: they keep
// working while their owners rotate them, and none lives forever.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('api_tokens').addColumn('expires_at', 'timestamptz').execute();
  await sql`UPDATE api_tokens SET expires_at = now() + interval '90 days'`.execute(db);
  await sql`ALTER TABLE api_tokens ALTER COLUMN expires_at SET NOT NULL`.execute(db);
  await sql`ALTER TABLE api_tokens ADD CONSTRAINT api_tokens_expire_after_creation CHECK (expires_at > created_at)`.execute(db);
  await db.schema.createIndex('api_tokens_user_created_idx').on('api_tokens').columns(['user_id', 'created_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('api_tokens_user_created_idx').execute();
  await db.schema.alterTable('api_tokens').dropColumn('expires_at').execute();
}
