import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { csvResponse } from '@/lib/platform/csv-response';
import { route } from '@/lib/platform/http';
import { exportFindingsCsv } from '@/lib/services/exports/csv';

type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const { csv, fileName } = await exportFindingsCsv(getDb(), user, (await params).id);
  return csvResponse(csv, fileName);
});
