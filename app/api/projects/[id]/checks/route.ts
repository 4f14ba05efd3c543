import { getDb } from '@/db';
import { listChecks } from '@/db/checks';
import { requireUser } from '@/lib/platform/auth/session';
import { runCheck } from '@/lib/services/checks/run-check';
import { json, parseBody, route } from '@/lib/platform/http';
import { checkRunRequestSchema } from '@/lib/domain/api/requests';

type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  return json({ checks: await listChecks(getDb(), user, (await params).id) });
});

export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const { revision } = await parseBody(request, checkRunRequestSchema);
  return json(await runCheck(getDb(), user, (await params).id, revision), 201);
});
