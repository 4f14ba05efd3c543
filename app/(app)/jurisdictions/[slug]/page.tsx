import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db';
import { findJurisdictionBySlug } from '@/db/jurisdictions';
import { JurisdictionForm } from '@/components/admin/jurisdiction-form';
import { formatDateTime, supportedTimeZones } from '@/lib/domain/dates/format';
import { PageHeader } from '@/components/ui/page-header';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';

export const metadata: Metadata = { title: 'Jurisdiction' };

export default async function JurisdictionPage({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  await requirePageUser(pageRoles['/jurisdictions'], `/jurisdictions/${slug}`);
  const j = await findJurisdictionBySlug(getDb(), slug);
  if (!j) notFound();
  return (
    <>
      <PageHeader kicker="Jurisdiction" title={j.name}>
        <Link href={`/rules/${slug}`} className="btn-secondary">Rule set versions</Link>
      </PageHeader>
      <p className="mb-4 max-w-prose text-sm text-ink-soft">
        Changing the adopted editions does not change published rules. Start a draft from the model-code baseline to
        re-cite the rules for new editions, dry-run it, then publish.
      </p>
      <p className="mb-4 max-w-prose text-sm text-ink-soft">
        Dates for this jurisdiction are shown in <strong>{j.timeZone}</strong>; its clock reads {formatDateTime(new Date(), j.timeZone)} now.
      </p>
      <JurisdictionForm
        jurisdiction={{ slug: j.slug, name: j.name, region: j.region, editions: j.editions, inspectorEmail: j.inspectorEmail, amendmentNotes: j.amendmentNotes, timeZone: j.timeZone }}
        timeZones={supportedTimeZones()}
      />
    </>
  );
}
