import 'server-only';
import PgBoss from 'pg-boss';
import { log } from '@/lib/platform/log';

/*
 * The job queue: pg-boss in its own schema (`pgboss`) of our PostgreSQL database, one instance per process,
 * started on first use. Every app server runs workers, so a job is done by whichever server fetches it first;
 * pg-boss hands each job to one worker (SELECT … FOR UPDATE SKIP LOCKED), and the handlers guard their own
 * side effects too, because a job can run again after a crash or a retry.
 */

export const JOB_SCHEMA = 'pgboss';

/** A job setting from the environment: a positive whole number, or the fallback when unset or anything else. */
export function positiveIntSetting(value: string | undefined, fallback: number): number {
  return value && /^\d+$/.test(value) && Number(value) > 0 ? Number(value) : fallback;
}

export type JobQueue = {
  name: string;
  /** Attempts after the first; pg-boss waits retryDelay seconds, doubling each time with jitter (retryBackoff). */
  retryLimit: number;
  retryDelaySeconds: number;
  expireInSeconds: number;
};

const g = globalThis as unknown as { nookpassBoss?: Promise<PgBoss>; nookpassBossStopping?: boolean; nookpassQueues?: Set<string> };

function connectionString(): string {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set; start NookPass with npm start.');
  return url;
}

/** The process's one boss, started lazily; a failed start is forgotten so the next call tries again. */
export function getBoss(): Promise<PgBoss> {
  g.nookpassBoss ??= (async () => {
    const boss = new PgBoss({
      connectionString: connectionString(),
      schema: JOB_SCHEMA,
      max: Number(process.env.NOOKPASS_JOB_POOL_SIZE ?? 4),
      application_name: 'nookpass-jobs',
      // Finished jobs stay visible for a week, then maintenance removes them.
      deleteAfterDays: 7,
    });
    boss.on('error', (err) => log.error({ err }, 'job queue error'));
    await boss.start();
    return boss;
  })().catch((err) => {
    g.nookpassBoss = undefined;
    throw err;
  });
  return g.nookpassBoss;
}

/** Creates the queue once per process (createQueue must come before send and work in pg-boss 10). */
export async function ensureQueue(queue: JobQueue): Promise<PgBoss> {
  const boss = await getBoss();
  g.nookpassQueues ??= new Set();
  if (!g.nookpassQueues.has(queue.name)) {
    const options = { retryLimit: queue.retryLimit, retryDelay: queue.retryDelaySeconds, retryBackoff: true, expireInSeconds: queue.expireInSeconds };
    // Creating is idempotent; the update brings a queue made by an older build to today's retry settings.
    if (!(await boss.getQueue(queue.name))) await boss.createQueue(queue.name, { name: queue.name, policy: 'standard', ...options });
    await boss.updateQueue(queue.name, { name: queue.name, ...options });
    g.nookpassQueues.add(queue.name);
  }
  return boss;
}

export async function enqueue<T extends object>(queue: JobQueue, data: T, options: PgBoss.SendOptions = {}): Promise<string | null> {
  const boss = await ensureQueue(queue);
  return boss.send(queue.name, data, options);
}

/**
 * Runs `handler` for each job of the queue, `concurrency` at a time in this process. A handler that throws
 * fails the job, which pg-boss retries with backoff until its retry limit. A worker that has just done a job
 * asks for the next one at once: pg-boss otherwise waits its polling interval after every fetch, found work
 * or not, which would hold a busy queue to one job per worker per interval.
 */
export async function work<T extends object>(
  queue: JobQueue,
  options: { concurrency?: number; pollingIntervalSeconds?: number },
  handler: (job: PgBoss.JobWithMetadata<T>) => Promise<unknown>,
): Promise<void> {
  const boss = await ensureQueue(queue);
  for (let i = 0; i < (options.concurrency ?? 1); i++) {
    let workerId: string | undefined;
    workerId = await boss.work<T>(
      queue.name,
      { batchSize: 1, includeMetadata: true, pollingIntervalSeconds: options.pollingIntervalSeconds ?? 2 },
      async ([job]) => {
        try {
          return await handler(job);
        } catch (err) {
          log.warn({ err, job: { id: job.id, name: job.name, retryCount: job.retryCount, retryLimit: job.retryLimit } }, 'job failed');
          throw err;
        } finally {
          if (workerId) boss.notifyWorker(workerId);
        }
      },
    );
  }
}

/** A cron schedule kept in the database: pg-boss sends one job per tick however many servers run. */
export async function schedule(queue: JobQueue, cron: string, data: object = {}): Promise<void> {
  const boss = await ensureQueue(queue);
  await boss.schedule(queue.name, cron, data);
}

export async function findJob(queue: JobQueue, id: string) {
  const boss = await ensureQueue(queue);
  return boss.getJobById(queue.name, id, { includeArchive: true });
}

/** Lets running jobs finish (up to timeoutMs) and closes the boss's pool; called when the process is told to stop. */
export async function stopJobs(timeoutMs = 10_000): Promise<void> {
  const pending = g.nookpassBoss;
  if (!pending || g.nookpassBossStopping) return;
  g.nookpassBossStopping = true;
  try {
    const boss = await pending;
    await boss.stop({ graceful: true, timeout: timeoutMs, wait: true });
  } catch (err) {
    log.error({ err }, 'job queue did not stop cleanly');
  } finally {
    g.nookpassBoss = undefined;
    g.nookpassQueues = undefined;
    g.nookpassBossStopping = false;
  }
}
