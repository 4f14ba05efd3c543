import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// An account is confirmed when it is made unless the person made it themselves (company sign-up, which
// inserts NULL and confirms by e-mail): accounts an administrator, an invitation or the demo seed creates
// come with an address someone vouched for. Accounts left unconfirmed with no confirmation ever sent are
// ones made that way before this default existed.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE users ALTER COLUMN email_confirmed_at SET DEFAULT now()`.execute(db);
  await sql`
    UPDATE users SET email_confirmed_at = created_at
    WHERE email_confirmed_at IS NULL
      AND NOT EXISTS (SELECT 1 FROM email_confirmations c WHERE c.user_id = users.id)`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE users ALTER COLUMN email_confirmed_at DROP DEFAULT`.execute(db);
}
