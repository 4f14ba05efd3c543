import type { Metadata } from 'next';
import { getDb } from '@/db';
import { listJurisdictions } from '@/db/jurisdictions';
import { CompanyForm } from '@/components/account/company-form';
import { PageHeader } from '@/components/ui/page-header';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';
import { getCompanySettings } from '@/lib/services/accounts/company';
import { WebhooksSection } from '@/components/webhooks/webhooks-section';
import { readWebhooksOverview } from '@/lib/services/webhooks/endpoints';

export const metadata: Metadata = { title: 'Company' };

export default async function CompanyPage() {
  const user = await requirePageUser(pageRoles['/company'], '/company');
  const db = getDb();
  const [settings, jurisdictions, webhooks] = await Promise.all([getCompanySettings(db, user), listJurisdictions(db), readWebhooksOverview(db, user)]);
  return (
    <>
      <PageHeader kicker="Company" title={settings.name} />
      {!user.isOwner && (
        <p className="mb-4 text-sm text-ink-soft" role="status">Only an owner of the company can change these details; ask one of them.</p>
      )}
      <CompanyForm
        editable={user.isOwner}
        jurisdictions={jurisdictions.map((j) => ({ slug: j.slug, name: j.name }))}
        initial={{
          name: settings.name,
          address: settings.address,
          phone: settings.phone,
          licenseNumber: settings.licenseNumber ?? '',
          defaultJurisdiction: settings.defaultJurisdiction?.slug ?? '',
        }}
      />
      <WebhooksSection
        editable={user.isOwner}
        endpoints={webhooks.endpoints.map((e) => ({ id: e.id, url: e.url, events: e.events, active: e.isActive, createdAt: e.createdAt.toISOString(), createdBy: e.createdBy?.name ?? null }))}
        deliveries={webhooks.deliveries.map((d) => ({
          id: d.id,
          endpointId: d.endpointId,
          eventType: d.eventType,
          status: d.status,
          attempts: d.attempts,
          maxAttempts: d.maxAttempts,
          lastResponseStatus: d.lastResponseStatus,
          lastError: d.lastError,
          createdAt: d.createdAt.toISOString(),
        }))}
      />
    </>
  );
}
