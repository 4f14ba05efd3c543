import { getDb } from '@/db';
import { getProject, updateProject } from '@/db/projects';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { projectUpdateSchema } from '@/lib/domain/projects/schema';

type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  return json(await getProject(getDb(), user, (await params).id));
});

export const PATCH = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const input = await parseBody(request, projectUpdateSchema);
  return json(await updateProject(getDb(), user, (await params).id, input));
});
