import 'server-only';
import type { DB } from '@/db';
import { listReferencedObjectKeys } from '@/db/stored-objects';
import { log } from '@/lib/platform/log';
import { deleteObject, listObjects } from '@/lib/platform/storage';
import type { JobQueue } from '@/lib/platform/jobs/boss';

/** Where the app stores objects; nothing outside these prefixes is ever touched. */
const PREFIXES = ['attachments/', 'reports/'];
/** An upload writes its objects before its row commits: only objects older than this can be orphans. */
export const SWEEP_MIN_AGE_SECONDS = 24 * 3600;

export const STORAGE_SWEEP_QUEUE: JobQueue = { name: 'storage-sweep', retryLimit: 2, retryDelaySeconds: 600, expireInSeconds: 3600 };

/**
 * The nightly sweep: removes stored objects no row refers to (a failed upload's leftovers, files of deleted
 * attachments). The objects are listed first and the rows read after, so an object whose row commits meanwhile
 * is seen as referenced.
 */
export async function sweepUnreferencedObjects(db: DB, opts: { minAgeSeconds?: number } = {}): Promise<{ examined: number; deleted: string[] }> {
  const minAgeSeconds = Math.max(0, opts.minAgeSeconds ?? SWEEP_MIN_AGE_SECONDS);
  const cutoff = Date.now() - minAgeSeconds * 1000;
  const candidates: string[] = [];
  let examined = 0;
  for (const prefix of PREFIXES) {
    for await (const o of listObjects(prefix)) {
      examined++;
      if (!o.lastModified || +o.lastModified <= cutoff) candidates.push(o.key);
    }
  }
  const referenced = await listReferencedObjectKeys(db);
  const deleted: string[] = [];
  for (const key of candidates) {
    if (referenced.has(key)) continue;
    await deleteObject(key);
    deleted.push(key);
  }
  log.info({ examined, deleted: deleted.length }, 'stored objects swept');
  return { examined, deleted };
}
