import type { Metadata } from 'next';
import Link from 'next/link';
import { ProjectsTable } from '@/components/projects/projects-table';
import { PageHeader } from '@/components/ui/page-header';
import { SafetyNotice } from '@/components/ui/safety-notice';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';

export const metadata: Metadata = { title: 'Projects' };

export default async function ProjectsPage() {
  const user = await requirePageUser(pageRoles['/projects'], '/projects');
  return (
    <>
      <PageHeader kicker={user.role === 'admin' ? 'All companies' : 'Your company’s jobs'} title="Projects">
        {user.role === 'installer' && <Link href="/projects/new" className="btn-primary">New project</Link>}
      </PageHeader>
      <ProjectsTable />
      <div className="mt-6"><SafetyNotice compact /></div>
    </>
  );
}
