import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { sendReport } from '@/lib/services/reports/send';
import { sendSchema } from '@/lib/domain/reports/send-schema';

type Ctx = { params: Promise<{ id: string }> };

export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  const body = await parseBody(request, sendSchema);
  return json(await sendReport(getDb(), user, (await params).id, body), 201);
});
