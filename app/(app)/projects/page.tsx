import type { Metadata } from 'next';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { SafetyNotice } from '@/components/ui/safety-notice';
import { pageRoles } from '@/lib/auth/roles';
import { requirePageUser } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Projects' };

export default async function ProjectsPage() {
  await requirePageUser(pageRoles['/projects'], '/projects');
  return (
    <>
      <PageHeader kicker="Your company's jobs" title="Projects" />
      <EmptyState title="No projects yet">
        <p>
          A project is one laundry closet at one site. Once you start one you describe the closet — enclosure,
          appliances, exhaust route, openings, receptacles, drain and doors — and run a pre-install check against
          the rules of the project&apos;s jurisdiction.
        </p>
      </EmptyState>
      <div className="mt-6"><SafetyNotice compact /></div>
    </>
  );
}
