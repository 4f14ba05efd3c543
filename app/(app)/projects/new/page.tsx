import type { Metadata } from 'next';
import { getDb } from '@/db';
import { listJurisdictions } from '@/db/jurisdictions';
import { ProjectForm } from '@/components/projects/project-form';
import { PageHeader } from '@/components/ui/page-header';
import { requirePageUser } from '@/lib/platform/auth/session';

export const metadata: Metadata = { title: 'New project' };

export default async function NewProjectPage() {
  await requirePageUser(['installer'], '/projects/new');
  const jurisdictions = await listJurisdictions(getDb());
  return (
    <>
      <PageHeader kicker="Projects" title="New project" />
      <ProjectForm jurisdictions={jurisdictions} />
    </>
  );
}
