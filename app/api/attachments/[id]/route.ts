import { z } from 'zod';
import { getDb } from '@/db';
import { attachmentSentToJurisdiction, displayKey, findAttachment, markAttachmentDeleted, updateCaption, type Attachment } from '@/db/attachments';
import { getProject } from '@/db/projects';
import type { AppUser } from '@/lib/domain/roles';
import { requireUser } from '@/lib/platform/auth/session';
import { NotFoundError } from '@/lib/domain/errors';
import { json, parseBody, route } from '@/lib/platform/http';
import { deleteObject, getObject } from '@/lib/platform/storage';

type Ctx = { params: Promise<{ id: string }> };

async function load(user: AppUser, id: string, write: boolean): Promise<Attachment> {
  const db = getDb();
  const a = await findAttachment(db, id);
  if (!a) throw new NotFoundError('No such file.');
  if (user.role === 'inspector') {
    if (!write && user.jurisdictionId && (await attachmentSentToJurisdiction(db, a.id, user.jurisdictionId))) return a;
    throw new NotFoundError('No such file.');
  }
  await getProject(db, user, a.projectId);
  return a;
}

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request);
  const a = await load(user, (await params).id, false);
  const variant = new URL(request.url).searchParams.get('variant');
  const key = variant === 'thumb' && a.thumbnailKey ? a.thumbnailKey : variant === 'display' && a.kind === 'photo' ? displayKey(a.storageKey) : a.storageKey;
  const bytes = await getObject(key);
  if (!bytes) throw new NotFoundError('The file is missing from storage.');
  const type = key === a.storageKey ? a.contentType : 'image/jpeg';
  return new Response(new Uint8Array(bytes), {
    headers: {
      'content-type': type,
      'content-length': String(bytes.length),
      'content-disposition': `${a.kind === 'photo' ? 'inline' : 'attachment'}; filename="${a.filename.replace(/"/g, '')}"`,
      'x-content-type-options': 'nosniff',
      'cache-control': 'private, max-age=300',
    },
  });
});

const patchSchema = z.strictObject({ caption: z.string().trim().max(300, 'Keep the caption under 300 characters.') });

export const PATCH = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const a = await load(user, (await params).id, true);
  const { caption } = await parseBody(request, patchSchema);
  await updateCaption(getDb(), a.id, caption, user.id);
  return json({ id: a.id, caption });
});

export const DELETE = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const a = await load(user, (await params).id, true);
  await markAttachmentDeleted(getDb(), a.id, user.id);
  // Issued reports keep their embedded copy; the stored files go.
  await Promise.allSettled([a.storageKey, a.thumbnailKey, a.kind === 'photo' ? displayKey(a.storageKey) : null].filter(Boolean).map((k) => deleteObject(k!)));
  return json({ deleted: true });
});
