import { getDb } from '@/db';
import { createProject, listProjects } from '@/db/projects';
import { requireUser } from '@/lib/platform/auth/session';
import { ValidationError } from '@/lib/domain/errors';
import { json, parseBody, route, zodErrors } from '@/lib/platform/http';
import { projectInputSchema, projectListQuerySchema } from '@/lib/domain/projects/schema';

export const GET = route(async (request) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const params = Object.fromEntries(new URL(request.url).searchParams);
  const q = projectListQuerySchema.safeParse(params);
  if (!q.success) throw new ValidationError(zodErrors(q.error));
  const { items, total } = await listProjects(getDb(), user, q.data);
  return json({ items, total, page: q.data.page, pageSize: q.data.pageSize });
});

export const POST = route(async (request) => {
  const user = await requireUser(request, ['installer']);
  const input = await parseBody(request, projectInputSchema);
  return json(await createProject(getDb(), user, input), 201);
});
