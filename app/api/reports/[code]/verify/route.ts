import { getDb } from '@/db';
import { findReportByCode } from '@/db/reports';
import { NotFoundError } from '@/lib/domain/errors';
import { hashBodyUpTo, json, route } from '@/lib/platform/http';
import { clientAddress } from '@/lib/platform/rate-limit';
import { countReportLookup } from '@/lib/services/reports/limits';

type Ctx = { params: Promise<{ code: string }> };
// Far above any issued report (a few MB with photos); the body is hashed as it arrives, never held.
const MAX_BYTES = 30 * 1024 * 1024;

/** POST the PDF's bytes: is this exactly the file NookPass issued under this code? */
export const POST = route<Ctx>(async (request, { params }) => {
  await countReportLookup(clientAddress(request));
  const report = await findReportByCode(getDb(), (await params).code);
  if (!report) throw new NotFoundError('NookPass issued no report with this code.');
  const { sha256 } = await hashBodyUpTo(request, MAX_BYTES, 'That file is far larger than any report.');
  return json({ code: report.code, genuine: sha256 === report.sha256, sha256, expected: report.sha256 });
});
