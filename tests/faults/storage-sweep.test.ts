import { randomBytes } from 'node:crypto';
import { sql } from 'kysely';
import PgBoss from 'pg-boss';
import { afterAll, describe, expect, it } from 'vitest';
import { displayKey, thumbnailKeyFor, withoutMetadataKey } from '@/db/attachments';
import { findObject, putObject } from '@/lib/platform/storage';
import { appDatabaseUrl, appDb } from '../integration/helpers';

/*
 * The nightly sweep of stored objects no row refers to. Run here, with the other tests that run alone, because
 * it is asked to take objects of any age: run beside uploads in progress, it could take one whose row is not yet
 * committed (the nightly run only takes objects older than a day).
 */

const db = appDb();
afterAll(async () => {
  await db.destroy();
});

describe('the stored-object sweep', () => {
  it('removes objects no row refers to and keeps every object a row refers to', { timeout: 120_000 }, async () => {
    const orphan = `attachments/sweep-test-${randomBytes(4).toString('hex')}/orphan.bin`;
    await putObject(orphan, Buffer.from('left behind by an upload that failed (test)'), 'application/octet-stream');
    const outside = `elsewhere/sweep-test-${randomBytes(4).toString('hex')}.bin`;
    await putObject(outside, Buffer.from('not under a prefix the app owns (test)'), 'application/octet-stream');
    // A photo and a report the earlier tests stored (rows of the demo seed may have no object in this store).
    const stored = async (keys: string[]) => {
      for (const k of keys) if (await findObject(k)) return k;
      throw new Error('no stored object found for these rows');
    };
    // A photo whose images the job has made (one that failed on purpose has none to keep).
    const photoKey = await stored((await db.selectFrom('attachments').select('storage_key').where('kind', '=', 'photo').where('derivatives_status', '=', 'ready').orderBy('created_at', 'desc').limit(50).execute()).map((r) => r.storage_key));
    const reportKey = await stored((await db.selectFrom('reports').select('storage_key').orderBy('created_at', 'desc').limit(50).execute()).map((r) => r.storage_key));

    // The served app's workers run the job; the nightly schedule sends the same job without minAgeSeconds.
    const boss = new PgBoss({ connectionString: appDatabaseUrl(), schema: 'pgboss', supervise: false, schedule: false, migrate: false });
    boss.on('error', () => undefined);
    await boss.start();
    try {
      const jobId = await boss.send('storage-sweep', { minAgeSeconds: 0 });
      expect(jobId).toBeTruthy();
      const deadline = Date.now() + 90_000;
      let state = 'created';
      while (Date.now() < deadline && !['completed', 'failed'].includes(state)) {
        await new Promise((r) => setTimeout(r, 500));
        state = (await sql<{ state: string }>`SELECT state FROM pgboss.job WHERE id = ${jobId}`.execute(db)).rows[0]?.state ?? 'gone';
      }
      expect(state).toBe('completed');
    } finally {
      await boss.stop({ graceful: false, wait: true });
    }
    expect(await findObject(orphan)).toBeNull();
    expect(await findObject(outside)).not.toBeNull();
    expect(await findObject(photoKey)).not.toBeNull();
    expect(await findObject(displayKey(photoKey))).not.toBeNull();
    // The images the thumbnail job made are referenced through the original's key.
    expect(await findObject(thumbnailKeyFor(photoKey))).not.toBeNull();
    expect(await findObject(withoutMetadataKey(photoKey))).not.toBeNull();
    expect(await findObject(reportKey)).not.toBeNull();
  });
});
