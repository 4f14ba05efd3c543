import { getDb } from '@/db';
import { reviewSchema } from '@/lib/domain/reports/review-schema';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { recordInspectionOutcome } from '@/lib/services/reports/review';

type Ctx = { params: Promise<{ reportId: string }> };

export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['inspector']);
  const review = await parseBody(request, reviewSchema);
  return json(await recordInspectionOutcome(getDb(), user, { reportId: (await params).reportId, review }), 201);
});
