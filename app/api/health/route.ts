import { getDb } from '@/db';
import { databaseAnswers } from '@/db/health';
import { json, route } from '@/lib/platform/http';

export const dynamic = 'force-dynamic';

// Public: load balancers and our scripts poll it. Says whether the database answers, nothing more.
export const GET = route(async () => ((await databaseAnswers(getDb())) ? json({ ok: true, db: 'up' }) : json({ ok: false, db: 'down' }, 503)));
