import { getDb } from '@/db';
import { projectDuplicateSchema } from '@/lib/domain/projects/duplicate';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { duplicateProject } from '@/lib/services/projects/duplicate';

type Ctx = { params: Promise<{ id: string }> };

/** A new project from this one's plan: `{ name?, siteAddress?, jurisdiction?, revision? }`. */
export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const input = await parseBody(request, projectDuplicateSchema);
  return json(await duplicateProject(getDb(), user, (await params).id, input), 201);
});
