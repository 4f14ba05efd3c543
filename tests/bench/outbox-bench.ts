import { randomBytes } from 'node:crypto';
import { sql } from 'kysely';
import PgBoss from 'pg-boss';
import { createDb } from '@/db/index';
import { insertOutboxMail } from '@/db/mail-outbox';
import { MAIL_QUEUE } from '@/lib/services/mail/outbox';

/*
 * E-mail outbox throughput: `count` messages are recorded at once, as many sends in a short time would, and handed to
 * the queue; the served app's workers deliver them through the local relay. Timed from the first job handed over to
 * the last message marked sent (polled every 50 ms), so the figure includes the workers' polling.
 */
export async function measureOutbox(count = 200) {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: run through npm run bench.');
  const db = createDb(url, 2);
  const boss = new PgBoss({ connectionString: url, schema: 'pgboss', supervise: false, schedule: false, migrate: false });
  boss.on('error', () => undefined);
  try {
    await boss.start();
    const tag = randomBytes(4).toString('hex');
    const ids: string[] = [];
    for (let i = 0; i < count; i++) {
      const mail = await insertOutboxMail(db, { kind: 'welcome', to: `bench-${tag}-${i}@example.test`, subject: `Bench message ${i} (demo)`, text: 'A benchmark message to a reserved test address.', maxAttempts: 3 });
      ids.push(mail.id);
    }
    const t0 = performance.now();
    for (const outboxId of ids) await boss.send(MAIL_QUEUE.name, { outboxId });
    for (;;) {
      const { rows } = await sql<{ sent: number; failed: number }>`
        SELECT count(*) FILTER (WHERE status = 'sent')::int AS sent, count(*) FILTER (WHERE status = 'failed')::int AS failed
        FROM mail_outbox WHERE id = ANY(${ids})`.execute(db);
      if (rows[0].failed > 0) throw new Error(`${rows[0].failed} bench messages failed; see the bench app's log.`);
      if (rows[0].sent === count) break;
      if (performance.now() - t0 > 300_000) throw new Error(`only ${rows[0].sent} of ${count} bench messages sent in 5 minutes`);
      await new Promise((r) => setTimeout(r, 50));
    }
    const seconds = (performance.now() - t0) / 1000;
    return { messages: count, seconds: Math.round(seconds * 100) / 100, outboxPerSecond: Math.round((count / seconds) * 10) / 10 };
  } finally {
    await boss.stop({ graceful: false }).catch(() => undefined);
    await db.destroy();
  }
}
