import type { Metadata } from 'next';
import { headers } from 'next/headers';
import Link from 'next/link';
import { getDb } from '@/db';
import { publicReportFacts } from '@/db/reports';
import { SummaryCounts } from '@/components/checks/summary-counts';
import { VerifyDrop } from '@/components/reports/verify-drop';
import { Wordmark } from '@/components/ui/logo';
import { SafetyNotice } from '@/components/ui/safety-notice';
import { TooManyRequestsError } from '@/lib/domain/errors';
import { clientAddressOf } from '@/lib/platform/rate-limit';
import { countReportLookup, REPORT_LOOKUP_LIMIT } from '@/lib/services/reports/limits';
import { formatDateTime } from '@/lib/domain/dates/format';

export const metadata: Metadata = { title: 'Verify a report' };
export const dynamic = 'force-dynamic';

function decoded(segment: string): string {
  try {
    return decodeURIComponent(segment);
  } catch {
    return segment; // a stray % is just part of a wrong code
  }
}

export default async function VerifyPage({ params }: { params: Promise<{ code: string }> }) {
  const code = decoded((await params).code);
  let limited: TooManyRequestsError | null = null;
  try {
    await countReportLookup(clientAddressOf(await headers()));
  } catch (err) {
    if (!(err instanceof TooManyRequestsError)) throw err;
    limited = err;
  }
  const facts = limited ? undefined : await publicReportFacts(getDb(), code);
  return (
    <main id="main" className="mx-auto max-w-3xl px-4 py-8">
      <Link href="/"><Wordmark /></Link>
      <p className="kicker mt-8">Report verification</p>
      {limited ? (
        <div data-testid="verify-limited">
          <h1 className="mt-2 text-2xl font-bold">Too many lookups for now</h1>
          <p className="mt-3 text-ink-soft">
            Your address has looked up more reports in the last minute than NookPass answers ({REPORT_LOOKUP_LIMIT.points} a
            minute), which keeps report codes from being guessed. Wait {limited.retryAfterSeconds} seconds and reload this page.
          </p>
        </div>
      ) : !facts ? (
        <>
          <h1 className="mt-2 text-2xl font-bold">No report with the code {code}</h1>
          <p className="mt-3 text-ink-soft">Check the code printed in the report’s footer. A code NookPass did not issue means the paper did not come from NookPass.</p>
        </>
      ) : (
        <>
          <h1 className="mt-2 text-2xl font-bold">{`Report ${facts.code} was issued by NookPass`}</h1>
          {!facts.asIssued && (
            <p className="mt-3 text-sm text-ink-soft" data-testid="verify-not-as-issued">
              This report was issued before NookPass recorded what each report said, so the project, site and jurisdiction
              below are as they are today and may differ from the paper. The SHA-256 below is the one recorded when it was
              issued: a copy that matches it is the report as issued.
            </p>
          )}
          <dl className="card mt-4 grid gap-3 p-5 text-sm sm:grid-cols-2" data-testid="verify-facts">
            <div><dt className="text-ink-faint">Project</dt><dd className="font-semibold">{facts.projectName}</dd></div>
            <div><dt className="text-ink-faint">Site</dt><dd>{facts.siteAddress}</dd></div>
            <div><dt className="text-ink-faint">Jurisdiction</dt><dd>{facts.jurisdictionName}</dd></div>
            <div><dt className="text-ink-faint">Installer company</dt><dd data-testid="verify-company">{facts.companyName}</dd></div>
            <div><dt className="text-ink-faint">Contractor licence number</dt><dd data-testid="verify-license">{facts.licenseNumber ?? 'not given'}</dd></div>
            <div><dt className="text-ink-faint">Rule set version</dt><dd>{facts.ruleSetVersion}</dd></div>
            <div><dt className="text-ink-faint">Check date</dt><dd>{formatDateTime(facts.checkedAt, facts.timeZone)}</dd></div>
            <div><dt className="text-ink-faint">Report issued</dt><dd>{formatDateTime(facts.issuedAt, facts.timeZone)} · {facts.pageCount} pages</dd></div>
            <div className="sm:col-span-2"><dt className="text-ink-faint">SHA-256 of the issued PDF</dt><dd className="break-all font-mono text-xs" data-testid="verify-hash">{facts.sha256}</dd></div>
          </dl>
          <div className="mt-4"><SummaryCounts summary={facts.summary} /></div>
          <section className="mt-6" aria-labelledby="drop-h">
            <h2 id="drop-h" className="mb-2 text-lg font-bold">Is your copy unaltered?</h2>
            <VerifyDrop expected={facts.sha256} />
          </section>
          <div className="mt-6"><SafetyNotice compact /></div>
        </>
      )}
    </main>
  );
}
