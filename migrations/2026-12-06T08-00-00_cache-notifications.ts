import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// App servers keep API token holders and each jurisdiction's published version in memory. Every change that
// would make such a copy wrong announces itself on the channel `nookpass_cache`, whichever server or script
// made it, and every listening server drops its copies. The payload names what changed: {"kind": ...}.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    CREATE FUNCTION nookpass_cache_notify() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      kind text := TG_ARGV[0];
      ref text;
    BEGIN
      IF kind = 'token' THEN
        ref := COALESCE(NEW.token_hash, OLD.token_hash);
      ELSIF kind = 'user' THEN
        ref := COALESCE(NEW.id, OLD.id)::text;
      ELSE
        ref := NULL;
      END IF;
      PERFORM pg_notify('nookpass_cache', json_build_object('kind', kind, 'ref', ref)::text);
      RETURN NULL;
    END $$`.execute(db);

  // A token's last-used time changes once a minute of use and says nothing a cached copy holds.
  await sql`
    CREATE TRIGGER api_tokens_cache_notify AFTER UPDATE ON api_tokens FOR EACH ROW
    WHEN (OLD.revoked_at IS DISTINCT FROM NEW.revoked_at OR OLD.expires_at IS DISTINCT FROM NEW.expires_at
          OR OLD.user_id IS DISTINCT FROM NEW.user_id OR OLD.token_hash IS DISTINCT FROM NEW.token_hash)
    EXECUTE FUNCTION nookpass_cache_notify('token')`.execute(db);
  await sql`
    CREATE TRIGGER api_tokens_cache_notify_delete AFTER DELETE ON api_tokens FOR EACH ROW
    EXECUTE FUNCTION nookpass_cache_notify('token')`.execute(db);
  await sql`
    CREATE TRIGGER users_cache_notify AFTER UPDATE OR DELETE ON users FOR EACH ROW
    EXECUTE FUNCTION nookpass_cache_notify('user')`.execute(db);
  await sql`
    CREATE TRIGGER rule_sets_cache_notify AFTER INSERT OR UPDATE OR DELETE ON rule_sets FOR EACH STATEMENT
    EXECUTE FUNCTION nookpass_cache_notify('rule-set')`.execute(db);
  await sql`
    CREATE TRIGGER jurisdictions_cache_notify AFTER INSERT OR UPDATE OR DELETE ON jurisdictions FOR EACH STATEMENT
    EXECUTE FUNCTION nookpass_cache_notify('jurisdiction')`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP TRIGGER IF EXISTS jurisdictions_cache_notify ON jurisdictions`.execute(db);
  await sql`DROP TRIGGER IF EXISTS rule_sets_cache_notify ON rule_sets`.execute(db);
  await sql`DROP TRIGGER IF EXISTS users_cache_notify ON users`.execute(db);
  await sql`DROP TRIGGER IF EXISTS api_tokens_cache_notify_delete ON api_tokens`.execute(db);
  await sql`DROP TRIGGER IF EXISTS api_tokens_cache_notify ON api_tokens`.execute(db);
  await sql`DROP FUNCTION IF EXISTS nookpass_cache_notify()`.execute(db);
}
