import 'server-only';
import type { DB } from '@/db';
import {
  claimAttachmentDerivatives,
  displayKey,
  failStalledDerivatives,
  listStalledDerivatives,
  markDerivativesAttemptFailed,
  markDerivativesReady,
  markDerivativesUnqueued,
  requeueFailedDerivatives,
  thumbnailKeyFor,
  withoutMetadataKey,
  type Attachment,
} from '@/db/attachments';
import { derivativesState } from '@/lib/domain/attachments/derivatives';
import { ConflictError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';
import { enqueue, type JobQueue, positiveIntSetting } from '@/lib/platform/jobs/boss';
import { log } from '@/lib/platform/log';
import { requeueOrEnd } from '@/lib/services/jobs/stalled-work';
import { findObject, putObject } from '@/lib/platform/storage';
import { makePhotoDerivatives, makeReportImage } from '@/lib/platform/uploads';
import { loadAttachmentFor } from '@/lib/services/attachments/access';

/*
 * A photo's thumbnail, report-size image and copy without metadata are made by a job, so the upload answers as
 * soon as the original is stored. The row says where the images are (pending → making → ready, or retrying and
 * failed after the last attempt); a worker claims the row by one conditional UPDATE before it makes anything, so
 * two app servers or a duplicated job make and store the images once. Keys are fixed by the original's key, so
 * readers and the storage sweep know them without asking.
 */


export function derivativesConfig() {
  return {
    /** First attempt plus retries; retries wait retryDelaySeconds × 1–2, then ×2–4, … (pg-boss retryBackoff). */
    maxAttempts: Math.min(20, positiveIntSetting(process.env.NOOKPASS_DERIVATIVE_ATTEMPTS, 4)),
    retryDelaySeconds: positiveIntSetting(process.env.NOOKPASS_DERIVATIVE_RETRY_DELAY_SECONDS, 10),
    /** A claim older than this belongs to a worker that died (a 40 MP photo takes a few seconds). */
    staleClaimSeconds: 120,
    /** A photo waiting this long untouched has lost its job; the pass every minute queues it again. */
    overdueGraceSeconds: positiveIntSetting(process.env.NOOKPASS_DERIVATIVE_OVERDUE_SECONDS, 600),
    pollingIntervalSeconds: Number(process.env.NOOKPASS_JOB_POLL_SECONDS ?? 1) || 1,
  };
}

export const DERIVATIVES_QUEUE: JobQueue = {
  name: 'attachment-derivatives',
  retryLimit: derivativesConfig().maxAttempts - 1,
  retryDelaySeconds: derivativesConfig().retryDelaySeconds,
  expireInSeconds: 120,
};

export const derivativeKeys = (storageKey: string) => ({ thumbnail: thumbnailKeyFor(storageKey), display: displayKey(storageKey), withoutMetadata: withoutMetadataKey(storageKey) });

/**
 * Hands a stored photo to the job queue. If the queue cannot be reached the row says so at once (failed, with
 * the reason), so the person can ask again instead of waiting for a job that was never sent.
 */
export async function dispatchDerivatives(db: DB, a: Pick<Attachment, 'id' | 'derivatives'>): Promise<void> {
  if (a.derivatives.status !== 'pending') return;
  try {
    await enqueue(DERIVATIVES_QUEUE, { attachmentId: a.id });
  } catch (err) {
    log.error({ err, attachmentId: a.id }, 'photo stored but its thumbnails were not queued');
    await markDerivativesUnqueued(db, a.id, 'The thumbnail could not be queued; make it again.').catch(() => undefined);
  }
}

/** The pass that finds photos whose images stalled; pg-boss sends it once a minute for all servers together. */
export const DERIVATIVES_SWEEP_QUEUE: JobQueue = { name: 'attachment-derivatives-sweep', retryLimit: 0, retryDelaySeconds: 30, expireInSeconds: 300 };

export const STALLED_DERIVATIVES_MESSAGE = 'The thumbnail was not finished: the server making it stopped. Make it again.';

/**
 * A photo whose images show no sign of progress (its job lost with a server, or every attempt cut short by a
 * server stopping) goes back in the queue; one whose attempts are spent is marked failed, so the person sees it
 * and can make it again.
 */
export async function requeueStalledDerivatives(db: DB): Promise<{ queued: number; failed: number }> {
  const cfg = derivativesConfig();
  return requeueOrEnd(await listStalledDerivatives(db, cfg.overdueGraceSeconds, cfg.staleClaimSeconds, 200), {
    spent: (a) => a.status === 'making' && a.attempts >= a.maxAttempts,
    end: (a) => failStalledDerivatives(db, a.id, cfg.staleClaimSeconds, STALLED_DERIVATIVES_MESSAGE),
    queue: DERIVATIVES_QUEUE,
    job: (a) => ({ attachmentId: a.id }),
    what: 'stalled photo thumbnails',
  });
}

class ImageUnreadable extends Error {}
export class DerivativesAttemptFailed extends Error {}

/**
 * One attempt at one photo's images, as the job runs it. Returns what happened; throws DerivativesAttemptFailed
 * when the job should be retried.
 */
export async function makeAttachmentDerivatives(db: DB, attachmentId: string, job: { lastTry: boolean }): Promise<'made' | 'not-claimed' | 'failed'> {
  const a = await claimAttachmentDerivatives(db, attachmentId, derivativesConfig().staleClaimSeconds);
  if (!a) return 'not-claimed';
  try {
    const original = await findObject(a.storageKey);
    if (!original) throw new Error('The photo is no longer stored.');
    const made = await makePhotoDerivatives(original, a.contentType).catch(() => {
      throw new ImageUnreadable('The image could not be read; it may be damaged.');
    });
    const keys = derivativeKeys(a.storageKey);
    await putObject(keys.thumbnail, made.thumbnail, 'image/jpeg');
    await putObject(keys.display, made.display, 'image/jpeg');
    await putObject(keys.withoutMetadata, made.withoutMetadata, a.contentType);
    await markDerivativesReady(db, a.id);
    return 'made';
  } catch (err) {
    // Storage errors carry endpoints and internals: the person sees a short reason, the log the whole error.
    const reason = err instanceof ImageUnreadable || (err instanceof Error && err.message === 'The photo is no longer stored.') ? err.message : 'Storage could not be reached.';
    const status = await markDerivativesAttemptFailed(db, a.id, reason, job.lastTry);
    log.warn({ err, attachmentId: a.id, attempt: a.derivatives.attempts, status }, 'photo thumbnails not made');
    if (status === 'retrying') throw new DerivativesAttemptFailed(reason);
    return 'failed';
  }
}

/** A photo's image state as the API answers it (the same words the pages show). */
export function derivativesBody(a: Pick<Attachment, 'id' | 'derivatives'>) {
  const state = derivativesState(a.derivatives);
  return { id: a.id, ...a.derivatives, label: state.label, canMakeAgain: state.canMakeAgain };
}

export async function getDerivativesState(db: DB, actor: AppUser, attachmentId: string) {
  const { a } = await loadAttachmentFor(db, actor, attachmentId, false);
  return derivativesBody(a);
}

/** "Make again": a photo whose images failed their last attempt goes back in the queue with a fresh set of attempts. */
export async function makeDerivativesAgain(db: DB, actor: AppUser, attachmentId: string) {
  const { a } = await loadAttachmentFor(db, actor, attachmentId, true);
  if (a.derivatives.status === 'ready') throw new ConflictError(`The thumbnail of ${a.filename} is already made.`);
  if (a.derivatives.status !== 'failed') throw new ConflictError(`The thumbnail of ${a.filename} is still being made; it can be made again after its last attempt.`);
  const requeued = await requeueFailedDerivatives(db, a.id, derivativesConfig().maxAttempts, actor.id);
  if (!requeued) throw new ConflictError(`The thumbnail of ${a.filename} was queued again meanwhile.`);
  await dispatchDerivatives(db, requeued);
  return derivativesBody(requeued);
}

/**
 * The image a report embeds for a photo. An issued report must show every photo it lists, so when the job has
 * not made it yet (or lost it) it is made here from the original, once for this report, and not stored: the
 * job stores its own. A photo that cannot be read stops the report with a 409 naming it.
 */
export async function reportImageFor(a: Attachment): Promise<Buffer> {
  if (a.derivatives.status === 'ready') {
    const stored = await findObject(displayKey(a.storageKey));
    if (stored) return stored;
  }
  const original = await findObject(a.storageKey);
  if (!original) throw new ConflictError(`The photo ${a.filename} is missing from storage; delete it and upload it again before issuing the report.`);
  try {
    return await makeReportImage(original);
  } catch {
    throw new ConflictError(`The photo ${a.filename} could not be read; it may be damaged. Delete it or upload it again before issuing the report.`);
  }
}
