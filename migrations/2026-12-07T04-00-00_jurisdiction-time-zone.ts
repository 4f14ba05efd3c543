import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// Each jurisdiction shows dates on its own clock. Rows from before have no known zone: they get UTC, which
// is what every report printed until now, so nothing already issued reads differently. The app checks the
// name against the IANA zones it knows; the database only keeps out the empty and the absurdly long.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    ALTER TABLE jurisdictions
      ADD COLUMN time_zone text NOT NULL DEFAULT 'UTC'
      CONSTRAINT jurisdictions_time_zone_shape CHECK (length(time_zone) BETWEEN 1 AND 64)`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE jurisdictions DROP COLUMN time_zone`.execute(db);
}
