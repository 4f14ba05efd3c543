import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';
import { getDerivativesState, makeDerivativesAgain } from '@/lib/services/attachments/derivatives';

type Ctx = { params: Promise<{ id: string }> };

/** Where a photo's thumbnail and report-size image are: pending, making, retrying, ready or failed. */
export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request);
  return json(await getDerivativesState(getDb(), user, (await params).id));
});

/** Queues a photo's images again after their last attempt failed; 409 while they are being made or once made. */
export const POST = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer']);
  return json(await makeDerivativesAgain(getDb(), user, (await params).id), 202);
});
