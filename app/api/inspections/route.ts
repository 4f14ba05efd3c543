import { getDb } from '@/db';
import { ValidationError } from '@/lib/domain/errors';
import { readInspectionFilter } from '@/lib/domain/reports/inspection-filter';
import { requireUser } from '@/lib/platform/auth/session';
import { json, route } from '@/lib/platform/http';
import { listInspectionQueue } from '@/lib/services/reports/inspection-queue';

/** The queue, one page at a time: `?q=&outcome=awaiting|approved|corrections-needed&from=YYYY-MM-DD&to=YYYY-MM-DD&page=`. */
export const GET = route(async (request) => {
  const user = await requireUser(request, ['inspector', 'admin']);
  const { filter, errors } = readInspectionFilter(new URL(request.url).searchParams);
  if (errors.length) throw new ValidationError(errors);
  const { items, total, page, pageSize } = await listInspectionQueue(getDb(), user, filter);
  return json({ inspections: items, total, page, pageSize });
});
