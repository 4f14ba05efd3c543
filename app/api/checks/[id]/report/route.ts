import { getDb } from '@/db';
import { requireUser } from '@/lib/auth/session';
import { route } from '@/lib/http';
import { issueReport, reportFilename } from '@/lib/report/issue';

type Ctx = { params: Promise<{ id: string }> };

// Each download issues a new report: its own code, its own recorded hash.
export const GET = route<Ctx>(async (request, { params }) => {
  const user = await requireUser(request, ['installer', 'admin']);
  const { report, pdf, project } = await issueReport(getDb(), user, (await params).id);
  return new Response(new Uint8Array(pdf), {
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': `attachment; filename="${reportFilename(project, report.code)}"`,
      'content-length': String(pdf.length),
      'cache-control': 'no-store',
      'x-report-code': report.code,
      'x-report-sha256': report.sha256,
    },
  });
});
