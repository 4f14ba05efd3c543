import { sql } from 'kysely';
import type { DB } from '@/db/index';
import type { AttachmentDerivatives } from '@/lib/domain/attachments/derivatives';
import { isUuid } from '@/lib/domain/ids';
import { writeAudit } from '@/db/audit';
import { receivedByInspector } from '@/db/reports';
import type { AttachmentsTable } from '@/db/types';
import type { Selectable } from 'kysely';

export type Attachment = {
  id: string;
  projectId: string;
  kind: 'photo' | 'document';
  filename: string;
  contentType: string;
  byteSize: number;
  sha256: string;
  storageKey: string;
  thumbnailKey: string | null;
  width: number | null;
  height: number | null;
  caption: string;
  createdBy: string | null;
  createdAt: Date;
  /** Thumbnail, report-size image and copy without metadata: made by a job after the upload. */
  derivatives: AttachmentDerivatives;
};

export function toAttachment(r: Selectable<AttachmentsTable>): Attachment {
  return {
    id: r.id,
    projectId: r.project_id,
    kind: r.kind,
    filename: r.filename,
    contentType: r.content_type,
    byteSize: r.byte_size,
    sha256: r.sha256,
    storageKey: r.storage_key,
    thumbnailKey: r.thumbnail_key,
    width: r.width,
    height: r.height,
    caption: r.caption,
    createdBy: r.created_by,
    createdAt: r.created_at,
    derivatives: { status: r.derivatives_status, attempts: r.derivatives_attempts, maxAttempts: r.derivatives_max_attempts, lastError: r.derivatives_error },
  };
}

export const thumbnailKeyFor = (storageKey: string) => `${storageKey}.thumb.jpg`;
export const displayKey = (storageKey: string) => `${storageKey}.display.jpg`;
/** The photo without its metadata, served to everyone outside the uploader's company. */
export const withoutMetadataKey = (storageKey: string) => `${storageKey}.no-metadata`;

export async function insertAttachment(
  db: DB,
  a: Omit<Attachment, 'id' | 'createdAt' | 'derivatives'> & { id: string; derivatives: Pick<AttachmentDerivatives, 'status' | 'maxAttempts'> },
  actorId: string,
): Promise<Attachment> {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .insertInto('attachments')
      .values({
        id: a.id,
        project_id: a.projectId,
        kind: a.kind,
        filename: a.filename,
        content_type: a.contentType,
        byte_size: a.byteSize,
        sha256: a.sha256,
        storage_key: a.storageKey,
        thumbnail_key: a.thumbnailKey,
        width: a.width,
        height: a.height,
        caption: a.caption,
        created_by: actorId,
        derivatives_status: a.derivatives.status,
        derivatives_max_attempts: a.derivatives.maxAttempts,
      })
      .returningAll()
      .executeTakeFirstOrThrow();
    await writeAudit(trx, { actorUserId: actorId, action: 'attachment.create', entityType: 'attachment', entityId: row.id, details: { projectId: a.projectId, filename: a.filename, bytes: a.byteSize } });
    return toAttachment(row);
  });
}

/**
 * Takes a photo's images for one attempt. Only one caller wins: the row must be waiting (pending or retrying),
 * or claimed so long ago that its worker must have died. Anyone else gets null and makes nothing.
 */
export async function claimAttachmentDerivatives(db: DB, id: string, staleClaimSeconds: number): Promise<Attachment | null> {
  if (!isUuid(id)) return null;
  const row = await db
    .updateTable('attachments')
    .set({ derivatives_status: 'making', derivatives_attempts: sql<number>`derivatives_attempts + 1`, derivatives_claimed_at: sql<Date>`now()`, derivatives_updated_at: sql<Date>`now()` })
    .where('id', '=', id)
    .where('deleted_at', 'is', null)
    .where((eb) =>
      eb.or([
        eb('derivatives_status', 'in', ['pending', 'retrying']),
        eb.and([eb('derivatives_status', '=', 'making'), eb('derivatives_claimed_at', '<', sql<Date>`now() - make_interval(secs => ${staleClaimSeconds})`)]),
      ]),
    )
    .returningAll()
    .executeTakeFirst();
  return row ? toAttachment(row) : null;
}

export async function markDerivativesReady(db: DB, id: string): Promise<void> {
  await db
    .updateTable('attachments')
    .set({ derivatives_status: 'ready', derivatives_error: null, derivatives_claimed_at: null, derivatives_updated_at: sql<Date>`now()` })
    .where('id', '=', id)
    .where('derivatives_status', '=', 'making')
    .execute();
}

/** Records a failed attempt: "retrying" while attempts remain, "failed" after the last. Returns the status written. */
export async function markDerivativesAttemptFailed(db: DB, id: string, error: string, final: boolean): Promise<'retrying' | 'failed' | null> {
  const row = await db
    .updateTable('attachments')
    .set({
      derivatives_status: final ? 'failed' : sql<'retrying' | 'failed'>`CASE WHEN derivatives_attempts >= derivatives_max_attempts THEN 'failed' ELSE 'retrying' END`,
      derivatives_error: error.slice(0, 300),
      derivatives_claimed_at: null,
      derivatives_updated_at: sql<Date>`now()`,
    })
    .where('id', '=', id)
    .where('derivatives_status', '=', 'making')
    .returning('derivatives_status')
    .executeTakeFirst();
  return (row?.derivatives_status as 'retrying' | 'failed' | undefined) ?? null;
}

/**
 * Photos whose images should be in the works but show no sign of it: waiting (pending or retrying) untouched for
 * `graceSeconds`, or claimed by a worker longer ago than `staleClaimSeconds` (it died, and its job is gone). Oldest first.
 */
export async function listStalledDerivatives(db: DB, graceSeconds: number, staleClaimSeconds: number, limit: number): Promise<{ id: string; attempts: number; maxAttempts: number; status: string }[]> {
  const rows = await db
    .selectFrom('attachments')
    .select(['id', 'derivatives_attempts', 'derivatives_max_attempts', 'derivatives_status'])
    .where('deleted_at', 'is', null)
    .where((eb) =>
      eb.or([
        eb.and([eb('derivatives_status', 'in', ['pending', 'retrying']), eb('derivatives_updated_at', '<', sql<Date>`now() - make_interval(secs => ${graceSeconds})`)]),
        eb.and([eb('derivatives_status', '=', 'making'), eb('derivatives_claimed_at', '<', sql<Date>`now() - make_interval(secs => ${staleClaimSeconds})`)]),
      ]),
    )
    .orderBy('derivatives_updated_at')
    .limit(limit)
    .execute();
  return rows.map((r) => ({ id: r.id, attempts: r.derivatives_attempts, maxAttempts: r.derivatives_max_attempts, status: r.derivatives_status }));
}

/** Ends a claim whose worker died after the last attempt: failed, so the person may make it again. False if it moved meanwhile. */
export async function failStalledDerivatives(db: DB, id: string, staleClaimSeconds: number, error: string): Promise<boolean> {
  const updated = await db
    .updateTable('attachments')
    .set({ derivatives_status: 'failed', derivatives_error: error, derivatives_claimed_at: null, derivatives_updated_at: sql<Date>`now()` })
    .where('id', '=', id)
    .where('derivatives_status', '=', 'making')
    .where('derivatives_claimed_at', '<', sql<Date>`now() - make_interval(secs => ${staleClaimSeconds})`)
    .executeTakeFirst();
  return Number(updated.numUpdatedRows) > 0;
}

/** The job could not be queued: the person is told at once and may ask again. */
export async function markDerivativesUnqueued(db: DB, id: string, error: string): Promise<void> {
  await db
    .updateTable('attachments')
    .set({ derivatives_status: 'failed', derivatives_error: error, derivatives_updated_at: sql<Date>`now()` })
    .where('id', '=', id)
    .where('derivatives_status', '=', 'pending')
    .execute();
}

/** Puts a photo whose images failed their last attempt back in line with a fresh set of attempts. */
export async function requeueFailedDerivatives(db: DB, id: string, maxAttempts: number, actorId: string): Promise<Attachment | null> {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .updateTable('attachments')
      .set({ derivatives_status: 'pending', derivatives_attempts: 0, derivatives_max_attempts: maxAttempts, derivatives_claimed_at: null, derivatives_updated_at: sql<Date>`now()` })
      .where('id', '=', id)
      .where('deleted_at', 'is', null)
      .where('derivatives_status', '=', 'failed')
      .returningAll()
      .executeTakeFirst();
    if (row) await writeAudit(trx, { actorUserId: actorId, action: 'attachment.derivatives-again', entityType: 'attachment', entityId: id });
    return row ? toAttachment(row) : null;
  });
}

export async function listAttachments(db: DB, projectId: string): Promise<Attachment[]> {
  const rows = await db.selectFrom('attachments').selectAll().where('project_id', '=', projectId).where('deleted_at', 'is', null).orderBy('created_at').execute();
  return rows.map(toAttachment);
}

export async function findAttachment(db: DB, id: string): Promise<Attachment | null> {
  if (!isUuid(id)) return null;
  const row = await db.selectFrom('attachments').selectAll().where('id', '=', id).where('deleted_at', 'is', null).executeTakeFirst();
  return row ? toAttachment(row) : null;
}

export async function updateCaption(db: DB, id: string, caption: string, actorId: string): Promise<void> {
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('attachments').set({ caption }).where('id', '=', id).execute();
    await writeAudit(trx, { actorUserId: actorId, action: 'attachment.caption', entityType: 'attachment', entityId: id });
  });
}

export async function markAttachmentDeleted(db: DB, id: string, actorId: string): Promise<void> {
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('attachments').set({ deleted_at: new Date() }).where('id', '=', id).execute();
    await writeAudit(trx, { actorUserId: actorId, action: 'attachment.delete', entityType: 'attachment', entityId: id });
  });
}

/** Inspectors may see an attachment only through a report sent to their jurisdiction's inspector address that includes it. */
export async function attachmentSentToJurisdiction(db: DB, attachmentId: string, jurisdictionId: string): Promise<boolean> {
  const row = await db
    .selectFrom('report_sends as s')
    .innerJoin('reports as r', 'r.id', 's.report_id')
    .innerJoin('jurisdictions as sj', 'sj.id', 's.jurisdiction_id')
    .select('s.id')
    .where('s.jurisdiction_id', '=', jurisdictionId)
    .where('s.status', '=', 'sent')
    .where(receivedByInspector('s', 'sj'))
    .where((eb) => eb(eb.fn('jsonb_exists', [eb.ref('r.attachment_ids'), eb.val(attachmentId)]), '=', true))
    .executeTakeFirst();
  return !!row;
}
