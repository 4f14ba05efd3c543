import { getDb } from '@/db';
import { publicReportFacts } from '@/db/reports';
import { NotFoundError } from '@/lib/domain/errors';
import { json, route } from '@/lib/platform/http';
import { clientAddress } from '@/lib/platform/rate-limit';
import { countReportLookup } from '@/lib/services/reports/limits';

type Ctx = { params: Promise<{ code: string }> };

// Public on purpose: an inspector holding the paper can confirm it without an account.
export const GET = route<Ctx>(async (request, { params }) => {
  await countReportLookup(clientAddress(request));
  const facts = await publicReportFacts(getDb(), (await params).code);
  if (!facts) throw new NotFoundError('NookPass issued no report with this code.');
  return json({
    code: facts.code,
    projectName: facts.projectName,
    siteAddress: facts.siteAddress,
    jurisdiction: facts.jurisdictionName,
    checkedAt: facts.checkedAt,
    issuedAt: facts.issuedAt,
    ruleSetVersion: facts.ruleSetVersion,
    summary: facts.summary,
    pageCount: facts.pageCount,
    sha256: facts.sha256,
    // false for reports issued before NookPass kept what each said: the details are the project as it is today.
    asIssued: facts.asIssued,
  });
});
