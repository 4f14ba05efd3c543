import { sql } from 'kysely';
import type { DB } from '@/db/index';

/** True when the database answers a trivial query. */
export async function databaseAnswers(db: DB): Promise<boolean> {
  try {
    await sql`SELECT 1`.execute(db);
    return true;
  } catch {
    return false;
  }
}
