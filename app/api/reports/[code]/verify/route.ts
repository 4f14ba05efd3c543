import { getDb } from '@/db';
import { findReportByCode } from '@/db/reports';
import { NotFoundError, PayloadTooLargeError } from '@/lib/domain/errors';
import { json, route } from '@/lib/platform/http';
import { sha256Hex } from '@/lib/platform/pdf/render';

type Ctx = { params: Promise<{ code: string }> };
const MAX = 30 * 1024 * 1024;

/** POST the PDF's bytes: is this exactly the file NookPass issued under this code? */
export const POST = route<Ctx>(async (request, { params }) => {
  const report = await findReportByCode(getDb(), (await params).code);
  if (!report) throw new NotFoundError('NookPass issued no report with this code.');
  if (Number(request.headers.get('content-length') ?? 0) > MAX) throw new PayloadTooLargeError('That file is far larger than any report.');
  const bytes = new Uint8Array(await request.arrayBuffer());
  if (bytes.length > MAX) throw new PayloadTooLargeError('That file is far larger than any report.');
  const sha256 = sha256Hex(bytes);
  return json({ code: report.code, genuine: sha256 === report.sha256, sha256, expected: report.sha256 });
});
