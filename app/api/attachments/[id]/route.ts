import { create as contentDisposition } from 'content-disposition';
import { getDb } from '@/db';
import { displayKey, markAttachmentDeleted, updateCaption, withoutMetadataKey, type Attachment } from '@/db/attachments';
import type { AppUser } from '@/lib/domain/roles';
import { requireUser } from '@/lib/platform/auth/session';
import { ConflictError, NotFoundError } from '@/lib/domain/errors';
import { derivativesState } from '@/lib/domain/attachments/derivatives';
import { loadAttachmentFor } from '@/lib/services/attachments/access';
import { json, parseBody, route } from '@/lib/platform/http';
import { deleteObject, findObject, putObject } from '@/lib/platform/storage';
import { stripPhotoMetadata } from '@/lib/platform/uploads';
import { attachmentUpdateSchema } from '@/lib/domain/api/requests';

type Ctx = { params: Promise<{ id: string }> };

const load = (user: AppUser, id: string, write: boolean) => loadAttachmentFor(getDb(), user, id, write);

/** The photo without metadata; one uploaded before such copies were kept, or whose job has not run yet, gets it made now, and stored. */
async function photoWithoutMetadata(a: Attachment): Promise<Buffer | null> {
  const key = withoutMetadataKey(a.storageKey);
  const stored = await findObject(key);
  if (stored) return stored;
  const original = await findObject(a.storageKey);
  if (!original) return null;
  const stripped = await stripPhotoMetadata(original, a.contentType).catch(() => {
    throw new ConflictError('The image could not be read; it may be damaged.');
  });
  await putObject(key, stripped, a.contentType);
  return stripped;
}

const asJpegName = (filename: string) => filename.replace(/\.[^.]*$/, '') + '.jpg';

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request);
  const { a, ownCompany } = await load(user, (await params).id, false);
  const variant = new URL(request.url).searchParams.get('variant');
  // Thumbnails and the display size are re-encoded JPEGs without metadata; the original keeps its EXIF
  // (camera, GPS position) only for the company that took it.
  let bytes: Buffer | null;
  let type = 'image/jpeg';
  let filename = a.filename;
  if ((variant === 'thumb' || variant === 'display') && a.kind === 'photo' && a.derivatives.status !== 'ready') {
    // Pages show the state instead of the image until the job has made it.
    throw new ConflictError(`The ${variant === 'thumb' ? 'thumbnail' : 'report-size image'} is not made yet (${derivativesState(a.derivatives).label}).`);
  }
  if (variant === 'thumb' && a.thumbnailKey) {
    bytes = await findObject(a.thumbnailKey);
    filename = asJpegName(a.filename);
  } else if (variant === 'display' && a.kind === 'photo') {
    bytes = await findObject(displayKey(a.storageKey));
    filename = asJpegName(a.filename);
  } else {
    type = a.contentType;
    bytes = a.kind === 'photo' && !ownCompany ? await photoWithoutMetadata(a) : await findObject(a.storageKey);
  }
  if (!bytes) throw new NotFoundError('The file is missing from storage.');
  return new Response(new Uint8Array(bytes), {
    headers: {
      'content-type': type,
      'content-length': String(bytes.length),
      // RFC 6266 with an RFC 8187 filename* for names outside ISO-8859-1, and a plain fallback beside it.
      'content-disposition': contentDisposition(filename, { type: a.kind === 'photo' ? 'inline' : 'attachment' }),
      'x-content-type-options': 'nosniff',
      'cache-control': 'private, max-age=300',
    },
  });
});

export const PATCH = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const { a } = await load(user, (await params).id, true);
  const { caption } = await parseBody(request, attachmentUpdateSchema);
  await updateCaption(getDb(), a.id, caption, user.id);
  return json({ id: a.id, caption });
});

export const DELETE = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const { a } = await load(user, (await params).id, true);
  await markAttachmentDeleted(getDb(), a.id, user.id);
  // Issued reports keep their embedded copy; the stored files go.
  await Promise.allSettled([a.storageKey, a.thumbnailKey, ...(a.kind === 'photo' ? [displayKey(a.storageKey), withoutMetadataKey(a.storageKey)] : [])].filter(Boolean).map((k) => deleteObject(k!)));
  return json({ deleted: true });
});
