import type { DB } from '@/db/index';
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
  };
}

export const displayKey = (storageKey: string) => `${storageKey}.display.jpg`;
/** The photo without its metadata, served to everyone outside the uploader's company. */
export const withoutMetadataKey = (storageKey: string) => `${storageKey}.no-metadata`;

export async function insertAttachment(
  db: DB,
  a: Omit<Attachment, 'id' | 'createdAt'> & { id: string },
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
      })
      .returningAll()
      .executeTakeFirstOrThrow();
    await writeAudit(trx, { actorUserId: actorId, action: 'attachment.create', entityType: 'attachment', entityId: row.id, details: { projectId: a.projectId, filename: a.filename, bytes: a.byteSize } });
    return toAttachment(row);
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
