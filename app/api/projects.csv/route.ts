import { getDb } from '@/db';
import { ValidationError } from '@/lib/domain/errors';
import { projectExportQuerySchema } from '@/lib/domain/exports/schema';
import { requireUser } from '@/lib/platform/auth/session';
import { csvResponse } from '@/lib/platform/csv-response';
import { route, zodErrors } from '@/lib/platform/http';
import { exportProjectsCsv } from '@/lib/services/exports/csv';

export const GET = route(async (request) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const q = projectExportQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!q.success) throw new ValidationError(zodErrors(q.error));
  const { csv, fileName } = await exportProjectsCsv(getDb(), user, q.data);
  return csvResponse(csv, fileName);
});
