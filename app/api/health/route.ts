import { getDb } from '@/db';
import { databaseAnswers } from '@/db/health';
import { json } from '@/lib/platform/http';

export const dynamic = 'force-dynamic';

// Public: load balancers and our scripts poll it. Says whether the database answers, nothing more.
export async function GET() {
  return (await databaseAnswers(getDb())) ? json({ ok: true, db: 'up' }) : json({ ok: false, db: 'down' }, 503);
}
