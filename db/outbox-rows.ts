import { sql } from 'kysely';
import type { DB } from '@/db/index';

/** Tables whose rows a job sends, with the same states: queued/retrying → sending → sent, or failed. */
export type OutboxTable = 'mail_outbox' | 'webhook_deliveries';

/**
 * Rows whose job must have been lost: waiting well past their due time (a crash between the commit and the
 * enqueue, or a job dropped), or claimed by a sender that never finished. Earliest due first.
 */
export async function listOverdueOutboxRows(db: DB, table: OutboxTable, graceSeconds: number, staleClaimSeconds: number, limit: number): Promise<string[]> {
  const { rows } = await sql<{ id: string }>`
    SELECT id FROM ${sql.table(table)}
    WHERE (status IN ('queued', 'retrying') AND next_attempt_at < now() - make_interval(secs => ${graceSeconds}))
       OR (status = 'sending' AND claimed_at < now() - make_interval(secs => ${staleClaimSeconds}))
    ORDER BY next_attempt_at
    LIMIT ${limit}`.execute(db);
  return rows.map((r) => r.id);
}
