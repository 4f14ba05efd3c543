import 'server-only';
import { enqueue, type JobQueue } from '@/lib/platform/jobs/boss';
import { log } from '@/lib/platform/log';

/**
 * What every stalled-work pass does with what it found: an item whose attempts are spent is ended (failed, with
 * the reason the person reads; `end` answers false when the item moved meanwhile), any other goes back in its
 * queue. A job sent twice is harmless: the worker's claim lets one of them do the work.
 */
export async function requeueOrEnd<T>(
  stalled: readonly T[],
  how: { spent: (item: T) => boolean; end: (item: T) => Promise<boolean>; queue: JobQueue; job: (item: T) => object; what: string },
): Promise<{ queued: number; failed: number }> {
  let queued = 0;
  let failed = 0;
  for (const item of stalled) {
    if (how.spent(item)) {
      if (await how.end(item)) failed += 1;
    } else {
      await enqueue(how.queue, how.job(item));
      queued += 1;
    }
  }
  if (stalled.length) log.info({ queued, failed }, `${how.what} queued again or ended`);
  return { queued, failed };
}
