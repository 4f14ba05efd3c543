import 'server-only';
import type { DB } from '@/db';
import { attachmentSentToJurisdiction, findAttachment, type Attachment } from '@/db/attachments';
import { getProject } from '@/db/projects';
import { NotFoundError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';

/**
 * The attachment, if the caller may see it (to change it, with `write`), and whether the caller belongs to the
 * company that uploaded it. Inspectors see one only through a report sent to their jurisdiction that includes it.
 */
export async function loadAttachmentFor(db: DB, user: AppUser, id: string, write: boolean): Promise<{ a: Attachment; ownCompany: boolean }> {
  const a = await findAttachment(db, id);
  if (!a) throw new NotFoundError('No such file.');
  if (user.role === 'inspector') {
    if (!write && user.jurisdictionId && (await attachmentSentToJurisdiction(db, a.id, user.jurisdictionId))) return { a, ownCompany: false };
    throw new NotFoundError('No such file.');
  }
  const project = await getProject(db, user, a.projectId);
  return { a, ownCompany: !!user.organizationId && user.organizationId === project.organizationId };
}
