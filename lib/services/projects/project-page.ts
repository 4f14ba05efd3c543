import 'server-only';
import { getDb } from '@/db';
import { getProject, type Project } from '@/db/projects';
import { findPublishedVersion, type RuleSetVersion } from '@/db/rule-sets';
import { requirePageUser } from '@/lib/platform/auth/session';
import type { AppUser } from '@/lib/domain/roles';
import { loadProjectOr404 } from '@/lib/platform/page-data';

/** What every project page needs: the signed-in user, the project (or a 404) and its jurisdiction's published rules. */
export async function loadProjectPage(id: string, path: string): Promise<{ user: AppUser; project: Project; published: RuleSetVersion | null }> {
  const user = await requirePageUser(['installer', 'admin'], path);
  const db = getDb();
  const project = await loadProjectOr404(() => getProject(db, user, id));
  const published = await findPublishedVersion(db, project.jurisdiction.id);
  return { user, project, published };
}
