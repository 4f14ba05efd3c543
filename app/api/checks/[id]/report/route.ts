import { create as contentDisposition } from 'content-disposition';
import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { ForbiddenError } from '@/lib/domain/errors';
import { route } from '@/lib/platform/http';
import { issueReport, reportFilename } from '@/lib/services/reports/issue';
import { countReportIssue } from '@/lib/services/usage-limits';

type Ctx = { params: Promise<{ id: string }> };

// Issuing records a new report (its own code, its own recorded hash), so it is a POST; an issued report is
// downloaded again with GET /api/reports/<code>/pdf.
export const POST = route<Ctx>(async (request, { params }) => {
  // Issuing records a report, so a link on another site must not trigger it (Fetch Metadata, W3C).
  if (request.headers.get('sec-fetch-site') === 'cross-site') throw new ForbiddenError('Download reports from NookPass itself.');
  const user = await requireUser(request, ['installer', 'admin']);
  await countReportIssue(user.id);
  const { report, pdf, project } = await issueReport(getDb(), user, (await params).id);
  return new Response(new Uint8Array(pdf), {
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': contentDisposition(reportFilename(project, report.code)),
      'content-length': String(pdf.length),
      'cache-control': 'no-store',
      'x-report-code': report.code,
      'x-report-sha256': report.sha256,
    },
  });
});
