import { getDb } from '@/db';
import { quickCheckSaveSchema } from '@/lib/domain/projects/duplicate';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { saveQuickCheck } from '@/lib/services/projects/duplicate';

/** Keeps a quick check as a project: `{ name, siteAddress, jurisdiction, plan }` → the new project, its plan as revision 1. */
export const POST = route(async (request) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const input = await parseBody(request, quickCheckSaveSchema);
  return json(await saveQuickCheck(getDb(), user, input), 201);
});
