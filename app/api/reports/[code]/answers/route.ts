import { getDb } from '@/db';
import { answerSchema } from '@/lib/domain/reports/thread';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { answerCorrections, loadThread } from '@/lib/services/reports/thread';

// The segment is a report's code or its id.
type Ctx = { params: Promise<{ code: string }> };

/** The report's thread: sends, outcomes and answers in order, with what changed in each answer. */
export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'inspector', 'admin']);
  return json(await loadThread(getDb(), user, (await params).code));
});

/** The installer answers "corrections needed" with a newer check and a note. */
export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const input = await parseBody(request, answerSchema);
  return json(await answerCorrections(getDb(), user, (await params).code, input), 201);
});
