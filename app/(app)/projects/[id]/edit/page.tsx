import type { Metadata } from 'next';
import { getDb } from '@/db';
import { listJurisdictions } from '@/db/jurisdictions';
import { getProject } from '@/db/projects';
import { ProjectForm } from '@/components/projects/project-form';
import { PageHeader } from '@/components/ui/page-header';
import { requirePageUser } from '@/lib/platform/auth/session';
import { loadProjectOr404 } from '@/lib/platform/page-data';

export const metadata: Metadata = { title: 'Edit project' };

export default async function EditProjectPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const user = await requirePageUser(['installer', 'admin'], `/projects/${id}/edit`);
  const project = await loadProjectOr404(() => getProject(getDb(), user, id));
  const jurisdictions = await listJurisdictions(getDb());
  return (
    <>
      <PageHeader kicker={project.name} title="Edit project" />
      <ProjectForm
        jurisdictions={jurisdictions}
        project={{
          id: project.id,
          name: project.name,
          siteAddress: project.siteAddress,
          jurisdiction: project.jurisdiction.slug,
          permitNumber: project.permitNumber ?? '',
          notes: project.notes,
          archived: !!project.archivedAt,
        }}
      />
    </>
  );
}
