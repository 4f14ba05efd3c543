import { randomUUID } from 'node:crypto';
import { getDb } from '@/db';
import { insertAttachment, listAttachments, thumbnailKeyFor } from '@/db/attachments';
import { getProject } from '@/db/projects';
import { requireUser } from '@/lib/platform/auth/session';
import { ValidationError } from '@/lib/domain/errors';
import { json, route } from '@/lib/platform/http';
import { readMultipartUpload } from '@/lib/platform/multipart';
import { deleteObject, putObject } from '@/lib/platform/storage';
import { checkUpload, MAX_UPLOAD_BYTES } from '@/lib/platform/uploads';
import { countUpload } from '@/lib/services/usage-limits';
import { derivativesConfig, dispatchDerivatives } from '@/lib/services/attachments/derivatives';

type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const db = getDb();
  const project = await getProject(db, user, (await params).id);
  return json({ attachments: (await listAttachments(db, project.id)).map(({ storageKey: _s, thumbnailKey: _t, ...a }) => a) });
});

export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const db = getDb();
  const project = await getProject(db, user, (await params).id);
  await countUpload(user.id);
  const { file, fields } = await readMultipartUpload(request, {
    fileField: 'file',
    maxFileBytes: MAX_UPLOAD_BYTES,
    fields: ['caption'],
    maxFieldBytes: 2 * 1024, // 300 characters of any script fit in 1,200 bytes of UTF-8
    tooLargeMessage: `Files can be at most ${MAX_UPLOAD_BYTES / 1024 / 1024} MB.`,
  });
  if (!file) throw new ValidationError([{ path: 'file', message: 'Choose a file to upload.' }]);
  const caption = (fields.caption ?? '').trim();
  if (caption.length > 300) throw new ValidationError([{ path: 'caption', message: 'Keep the caption under 300 characters.' }]);
  const checked = await checkUpload(file.bytes, file.filename);

  const id = randomUUID();
  const key = `attachments/${project.id}/${id}`;
  // Only the original is stored here; a job makes the photo's thumbnail, report-size image and copy without metadata.
  await putObject(key, checked.bytes, checked.contentType);
  const isPhoto = checked.kind === 'photo';
  let saved;
  try {
    saved = await insertAttachment(
      db,
      {
        id,
        projectId: project.id,
        kind: checked.kind,
        filename: checked.filename,
        contentType: checked.contentType,
        byteSize: checked.bytes.length,
        sha256: checked.sha256,
        storageKey: key,
        thumbnailKey: isPhoto ? thumbnailKeyFor(key) : null,
        width: checked.width,
        height: checked.height,
        caption,
        createdBy: user.id,
        derivatives: { status: isPhoto ? 'pending' : 'ready', maxAttempts: derivativesConfig().maxAttempts },
      },
      user.id,
    );
  } catch (err) {
    // Nothing half-saved: the original is removed again when its row could not be written.
    await deleteObject(key).catch(() => undefined);
    throw err;
  }
  await dispatchDerivatives(db, saved);
  const { storageKey: _s, thumbnailKey: _t, ...out } = saved;
  return json(out, 201);
});
