import { sql } from 'kysely';
import { getDb } from '@/db';
import { json } from '@/lib/platform/http';

export const dynamic = 'force-dynamic';

// Public: load balancers and our scripts poll it. Says whether the database answers, nothing more.
export async function GET() {
  try {
    await sql`SELECT 1`.execute(getDb());
    return json({ ok: true, db: 'up' });
  } catch {
    return json({ ok: false, db: 'down' }, 503);
  }
}
