import { getDb } from '@/db';
import { publicReportFacts } from '@/db/reports';
import { NotFoundError } from '@/lib/errors';
import { json, route } from '@/lib/http';
import { clientAddress } from '@/lib/platform/rate-limit';
import { countReportLookup } from '@/lib/report/lookups';

type Ctx = { params: Promise<{ code: string }> };

// Public on purpose: an inspector holding the paper can confirm it without an account.
export const GET = route<Ctx>(async (request, { params }) => {
  await countReportLookup(clientAddress(request));
  const facts = await publicReportFacts(getDb(), (await params).code);
  if (!facts) throw new NotFoundError('NookPass issued no report with this code.');
  return json({
    code: facts.code,
    projectName: facts.project_name,
    siteAddress: facts.site_address,
    jurisdiction: facts.jurisdiction_name,
    checkedAt: facts.checked_at,
    issuedAt: facts.issued_at,
    ruleSetVersion: facts.rule_set_version,
    summary: facts.summary,
    pageCount: facts.page_count,
    sha256: facts.sha256,
  });
});
