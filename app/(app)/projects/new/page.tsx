import type { Metadata } from 'next';
import { getDb } from '@/db';
import { listJurisdictions } from '@/db/jurisdictions';
import { findCompanySettings } from '@/db/organizations';
import { ProjectForm } from '@/components/projects/project-form';
import { PageHeader } from '@/components/ui/page-header';
import { requirePageUser } from '@/lib/platform/auth/session';

export const metadata: Metadata = { title: 'New project' };

export default async function NewProjectPage() {
  const user = await requirePageUser(['installer'], '/projects/new');
  const db = getDb();
  const [jurisdictions, company] = await Promise.all([listJurisdictions(db), user.organizationId ? findCompanySettings(db, user.organizationId) : null]);
  return (
    <>
      <PageHeader kicker="Projects" title="New project" />
      <ProjectForm jurisdictions={jurisdictions} defaultJurisdiction={company?.defaultJurisdiction?.slug ?? ''} />
    </>
  );
}
