import type { Metadata } from 'next';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { pageRoles } from '@/lib/auth/roles';
import { requirePageUser } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Rules' };

export default async function RulesPage() {
  await requirePageUser(pageRoles['/rules'], '/rules');
  return (
    <>
      <PageHeader kicker="Administration" title="Rule sets" />
      <EmptyState title="No rule sets are published yet">
        <p>
          Each jurisdiction gets one versioned rule set: the adopted code editions, local amendments and thresholds.
          Versions go from draft to published (then unchangeable) to retired, and every check stays pinned to the
          version it ran on.
        </p>
      </EmptyState>
    </>
  );
}
