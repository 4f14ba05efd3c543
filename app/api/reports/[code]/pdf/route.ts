import { create as contentDisposition } from 'content-disposition';
import { getDb } from '@/db';
import { findReportByCode } from '@/db/reports';
import { requireUser } from '@/lib/platform/auth/session';
import { NotFoundError } from '@/lib/domain/errors';
import { route } from '@/lib/platform/http';
import { assertCanReadReport } from '@/lib/services/reports/access';
import { findObject } from '@/lib/platform/storage';

type Ctx = { params: Promise<{ code: string }> };

/** The stored file of an issued report, byte for byte. */
export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request);
  const db = getDb();
  const report = await findReportByCode(db, (await params).code);
  if (!report) throw new NotFoundError('No such report.');
  await assertCanReadReport(db, user, report);
  const pdf = await findObject(report.storageKey);
  if (!pdf) throw new NotFoundError('The report file is missing from storage.');
  return new Response(new Uint8Array(pdf), {
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': contentDisposition(`nookpass-report-${report.code}.pdf`),
      'cache-control': 'private, no-store',
    },
  });
});
