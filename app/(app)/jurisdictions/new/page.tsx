import type { Metadata } from 'next';
import { getDb } from '@/db';
import { listJurisdictionOverview } from '@/db/jurisdictions';
import { JurisdictionForm } from '@/components/admin/jurisdiction-form';
import { supportedTimeZones } from '@/lib/domain/dates/format';
import { PageHeader } from '@/components/ui/page-header';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';

export const metadata: Metadata = { title: 'New jurisdiction' };

export default async function NewJurisdictionPage() {
  await requirePageUser(pageRoles['/jurisdictions'], '/jurisdictions/new');
  const list = await listJurisdictionOverview(getDb());
  const startOptions = list.filter((j) => j.published).map((j) => ({ slug: j.slug, name: j.name, version: j.published!.version }));
  return (
    <>
      <PageHeader kicker="Administration" title="New jurisdiction" />
      <JurisdictionForm startOptions={startOptions} timeZones={supportedTimeZones()} />
    </>
  );
}
